using System.Text.Json;
using System.Text.Json.Nodes;
using Plumbline.Reports.Model;
using Plumbline.Reports.Json;
using Plumbline.Reports.Tests.Fixtures;

namespace Plumbline.Reports.Tests.Schema;

/// <summary>The schema must accept what the writer produces and reject documents that break the report's rules.</summary>
public sealed class ReportSchemaTests
{
    /// <summary>Each case breaks one rule of a valid report; claims[0] is settled, claims[2] failed.</summary>
    private static readonly Dictionary<string, Action<JsonObject>> Breakages = new()
    {
        ["status maybe"] = r => Claim(r, 0)["status"] = "maybe",
        ["margin missing"] = r => Claim(r, 0).Remove("margin"),
        ["unknown claim property"] = r => Claim(r, 0)["confidence"] = 0.9,
        ["unknown top-level property"] = r => r["extra"] = true,
        ["integrity maybe"] = r => Claim(r, 0)["statements"]![0]!["integrity"] = "maybe",
        ["integrity as boolean"] = r => Claim(r, 0)["statements"]![0]!["integrity"] = true,
        ["probability above one"] = r => Claim(r, 0)["links"]![0]!["probability"] = 1.5,
        ["link kind neutral"] = r => Claim(r, 0)["links"]![0]!["kind"] = "neutral",
        ["answer as string"] = r => Claim(r, 0)["answer"] = "true",
        ["settled claim without answer"] = r => Claim(r, 0)["answer"] = null,
        ["settled claim with error"] = r => Claim(r, 0)["error"] = "oops",
        ["failed claim without reason"] = r => Claim(r, 2)["error"] = null,
        ["failed claim with answer"] = r => Claim(r, 2)["answer"] = true,
        ["negative margin"] = r => Claim(r, 0)["margin"] = -0.5,
        ["started not a date-time"] = r => r["started"] = "yesterday",
        ["schema version 1"] = r => r["schema_version"] = 1,
        ["statement without value"] = r => ((JsonObject)Claim(r, 0)["statements"]![0]!).Remove("value"),
        ["pair without backward scores"] = r => ((JsonObject)Claim(r, 0)["pairs"]![0]!).Remove("backward"),
        ["clause kind unknown"] = r => Claim(r, 0)["falsified_clauses"]![0]!["kind"] = "hunch",
        ["completion missing"] = r => r.Remove("completion"),
        ["gate without result"] = r => r["gates"] = new JsonArray(new JsonObject { ["name"] = "g", ["value"] = 1, ["comparison"] = ">=", ["threshold"] = 1 }),
        ["notice missing"] = r => r.Remove("notice"),
        ["weighting unknown"] = r => r["settings"]!["weighting"] = "heavy",
        ["link without negation flags"] = r => ((JsonObject)Claim(r, 0)["links"]![0]!).Remove("from_negation"),
        ["accuracy without interval"] = r => ((JsonObject)r["figures"]!["direct_accuracy"]!).Remove("wilson_95"),
    };

    public static TheoryData<string> BreakageNames => [.. Breakages.Keys];

    private static JsonObject Claim(JsonObject report, int index) => (JsonObject)report["claims"]![index]!;

    private static async Task<JsonObject> ValidReportAsync() =>
        (JsonObject)JsonNode.Parse(await ReportOutput.TextAsync(new JsonReportWriter(), SampleReports.Mixed()))!;

    [Fact]
    public async Task Evaluate_UnchangedReport_Valid()
    {
        var report = await ValidReportAsync();

        var results = ReportSchemaFile.Evaluate(report.ToJsonString());

        Assert.True(results.IsValid, ReportSchemaFile.Describe(results));
    }

    [Theory]
    [MemberData(nameof(BreakageNames))]
    public async Task Evaluate_BrokenReport_Rejected(string breakage)
    {
        var report = await ValidReportAsync();
        Breakages[breakage](report);

        var results = ReportSchemaFile.Evaluate(report.ToJsonString());

        Assert.False(results.IsValid, $"the schema accepted a report with: {breakage}");
    }

    [Fact]
    public void SchemaFile_Version_MatchesReportVersion()
    {
        var path = ReportSchemaFile.PathOf(RunHeader.CurrentSchemaVersion);
        using var schema = JsonDocument.Parse(File.ReadAllText(path));
        var root = schema.RootElement;

        Assert.Equal(ReportSchema.FileName, Path.GetFileName(path));
        Assert.Equal("https://json-schema.org/draft/2020-12/schema", root.GetProperty("$schema").GetString());
        Assert.Equal(ReportSchema.Id.ToString(), root.GetProperty("$id").GetString());
        Assert.Equal(RunHeader.CurrentSchemaVersion,
            root.GetProperty("properties").GetProperty("schema_version").GetProperty("const").GetInt32());
    }

    [Fact]
    public void RepositoryRoot_HoldsSolutionAndSchemaFolder()
    {
        var root = ReportSchemaFile.RepositoryRoot();

        Assert.True(File.Exists(Path.Combine(root, ReportSchemaFile.SolutionFile)));
        Assert.True(Directory.Exists(Path.Combine(root, ReportSchema.Folder)));
    }
}
