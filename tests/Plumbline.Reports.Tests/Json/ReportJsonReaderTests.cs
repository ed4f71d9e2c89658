using System.Text;
using System.Text.Json.Nodes;
using Plumbline.Core.Claims;
using Plumbline.Reports.Json;
using Plumbline.Reports.Model;
using Plumbline.Reports.Tests.Fixtures;

namespace Plumbline.Reports.Tests.Json;

public sealed class ReportJsonReaderTests
{
    private static async Task<string> WriteAsync(RunReport report, string format = "json")
    {
        using var buffer = new MemoryStream();
        await ReportWriterRegistry.Default.Create(format).WriteAsync(report, buffer, CancellationToken.None);
        return Encoding.UTF8.GetString(buffer.ToArray());
    }

    /// <summary>The sample run with its input recorded, claims numbered and the reports' all-pairs listing.</summary>
    private static RunReport Sample()
    {
        var report = SampleReports.Report([SampleReports.Settled, SampleReports.Overturned, SampleReports.Failed], SampleReports.Started.AddSeconds(4.5), PairListing.All);
        var claims = report.Claims.ReadAsync(CancellationToken.None).ToBlockingEnumerable().Select((c, i) => c with { Position = i + 1 }).ToList();
        return report with
        {
            Header = report.Header with { Input = new RunInput("claims.jsonl", 3, "sha256:" + new string('a', 64), new ClaimShard(2, 4)) },
            Claims = new ClaimReportList(claims),
        };
    }

    private static string WithoutFigures(string json)
    {
        var root = JsonNode.Parse(json)!.AsObject();
        root.Remove("figures");
        return root.ToJsonString();
    }

    [Fact]
    public async Task Read_JsonReport_WritesBackTheSameJson()
    {
        var json = await WriteAsync(Sample());

        var read = ReportJsonReader.Read(json, "report.json");

        // Figures are recomputed from the claims' printed numbers; everything else comes back byte for byte.
        Assert.Equal(WithoutFigures(json), WithoutFigures(await WriteAsync(read)));
        Assert.Equal([1, 2, 3], read.Claims.ReadAsync(CancellationToken.None).ToBlockingEnumerable().Select(c => c.Position));
        Assert.Equal(new ClaimShard(2, 4), read.Header.Input!.Shard);
    }

    [Fact]
    public async Task Read_RecomputedFigures_FromThePrintedMargins()
    {
        var read = ReportJsonReader.Read(await WriteAsync(Sample()), "report.json");

        // Settled: margin 1.23456, printed 1.2346; overturned 0.5; the failed claim is not judged: (1.2346 + 0.5) / 2.
        Assert.Equal((3, 2, 1), (read.Figures.Claims, read.Figures.Judged, read.Figures.Failed));
        Assert.Equal(0.8673, read.Figures.MeanMargin, 12);
        Assert.Equal(TimeSpan.FromSeconds(4.5), read.Figures.WallTime);
    }

    [Fact]
    public async Task Read_JsonLinesReport_SameAsTheJsonReport()
    {
        var report = Sample();

        var fromLines = ReportJsonReader.Read(await WriteAsync(report, "jsonl"), "report.jsonl");

        Assert.Equal(await WriteAsync(report), await WriteAsync(fromLines with { Figures = report.Figures }));
    }

    [Fact]
    public async Task Read_OtherSchemaVersion_Refused()
    {
        var json = (await WriteAsync(Sample())).Replace("\"schema_version\": 2", "\"schema_version\": 3", StringComparison.Ordinal);

        var error = Assert.Throws<ReportReadException>(() => ReportJsonReader.Read(json, "new.json"));

        Assert.Equal("new.json: report schema version 3; this plumb reads version 2 (read it with the plumb that wrote it, or run again)", error.Message);
    }

    [Fact]
    public async Task Read_FieldMissing_NamesItsPath()
    {
        var root = JsonNode.Parse(await WriteAsync(Sample()))!.AsObject();
        root["claims"]![1]!["statements"]![0]!.AsObject().Remove("belief");

        var error = Assert.Throws<ReportReadException>(() => ReportJsonReader.Read(root.ToJsonString(), "cut.json"));

        Assert.Equal("cut.json: claims[1].statements[0].belief: missing", error.Message);
    }

    [Fact]
    public async Task Read_WrongTypeOrWord_NamesThePathAndWhatWasFound()
    {
        var root = JsonNode.Parse(await WriteAsync(Sample()))!.AsObject();
        root["claims"]![0]!["margin"] = "big";
        Assert.Equal("x.json: claims[0].margin: expected a number, found a string",
            Assert.Throws<ReportReadException>(() => ReportJsonReader.Read(root.ToJsonString(), "x.json")).Message);

        root["claims"]![0]!["margin"] = 1;
        root["claims"]![0]!["status"] = "resolved";
        Assert.Equal("x.json: claims[0].status: unknown value 'resolved'",
            Assert.Throws<ReportReadException>(() => ReportJsonReader.Read(root.ToJsonString(), "x.json")).Message);
    }

    [Theory]
    [InlineData("[1, 2]", "a.json: not a plumb report (no schema_version)")]
    [InlineData("{\"schema_version\": \"2\"}", "a.json: report schema version \"2\"; this plumb reads version 2 (read it with the plumb that wrote it, or run again)")]
    [InlineData("{\n\"schema_version\": 2,\n}", "a.json:3: not valid JSON")]
    public void Read_NotAReport_Refused(string text, string message) =>
        Assert.Equal(message, Assert.Throws<ReportReadException>(() => ReportJsonReader.Read(text, "a.json")).Message);

    [Fact]
    public async Task Read_JsonLinesWithoutSummary_SaysTheRunDidNotFinish()
    {
        var lines = (await WriteAsync(Sample(), "jsonl")).TrimEnd('\n').Split('\n');

        var error = Assert.Throws<ReportReadException>(() => ReportJsonReader.Read(string.Join('\n', lines[..^1]), "cut.jsonl"));

        Assert.Equal("cut.jsonl: no summary record (the run did not finish writing)", error.Message);
    }
}
