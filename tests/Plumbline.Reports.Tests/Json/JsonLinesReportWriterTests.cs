using System.Text.Json;
using Plumbline.Reports.Json;
using Plumbline.Reports.Tests.Fixtures;
using Plumbline.Reports.Tests.Schema;

namespace Plumbline.Reports.Tests.Json;

public sealed class JsonLinesReportWriterTests
{
    private static async Task<string[]> LinesAsync() =>
        (await ReportOutput.TextAsync(new JsonLinesReportWriter(), SampleReports.Mixed())).Split('\n', StringSplitOptions.RemoveEmptyEntries);

    [Fact]
    public async Task WriteAsync_RunThenClaimsInOrderThenSummary()
    {
        var lines = await LinesAsync();

        var records = lines.Select(l => JsonDocument.Parse(l).RootElement.GetProperty("record").GetString()).ToList();
        Assert.Equal(["run", "claim", "claim", "claim", "summary"], records);
        Assert.Equal(["c1", "c2", "c3"], lines[1..4].Select(l => JsonDocument.Parse(l).RootElement.GetProperty("id").GetString()));
        Assert.Equal(3, JsonDocument.Parse(lines[^1]).RootElement.GetProperty("figures").GetProperty("claims").GetInt32());
    }

    [Fact]
    public async Task WriteAsync_EveryLine_ValidAgainstTheLinesSchema()
    {
        foreach (var line in await LinesAsync())
        {
            var results = ReportSchemaFile.EvaluateLine(line);
            Assert.True(results.IsValid, line[..Math.Min(60, line.Length)] + "\n" + ReportSchemaFile.Describe(results));
        }
    }

    [Fact]
    public async Task EvaluateLine_ClaimWithUnknownField_Rejected()
    {
        var claim = (await LinesAsync())[1].Replace("\"record\":\"claim\",", "\"record\":\"claim\",\"extra\":1,", StringComparison.Ordinal);

        Assert.False(ReportSchemaFile.EvaluateLine(claim).IsValid);
    }

    [Fact]
    public async Task WriteAsync_ClaimRecord_SameObjectAsInTheJsonReport()
    {
        var line = JsonDocument.Parse((await LinesAsync())[2]).RootElement;
        using var report = JsonDocument.Parse(await ReportOutput.TextAsync(new JsonReportWriter(), SampleReports.Mixed()));
        var entry = report.RootElement.GetProperty("claims")[1];

        Assert.Equal(entry.EnumerateObject().Select(p => p.Name), line.EnumerateObject().Skip(1).Select(p => p.Name));
        Assert.Equal(entry.GetProperty("margin").GetRawText(), line.GetProperty("margin").GetRawText());
    }
}
