using System.Text.Json.Nodes;
using Plumbline.Cli.Tests.EndToEnd;

namespace Plumbline.Cli.Tests.Commands;

/// <summary>The demo sweep split into three shards and merged, against the same sweep unsharded (real NLI model and solver).</summary>
public sealed class ShardCommandTests
{
    private static string Sample(string file) => Path.Combine(SampleSweep.RepositoryRoot, SampleSweep.Scenario, file);

    private static Task<PlumbResult> SweepAsync(params string[] extra) =>
        Plumb.RunAsync(["sweep", Sample("claims.jsonl"), "--model", "recording:" + Sample("recording.jsonl"), "--quiet", .. extra]);

    [Fact]
    public async Task Merge_ThreeShardsOfTheDemo_EqualsTheUnshardedRun()
    {
        using var folder = new TempDirectory();
        var whole = await SweepAsync("--format", "json", "-o", folder.File("all.json"), "--min-coherent-accuracy", "0.75");
        Assert.True(whole.ExitCode == 0, whole.ToString());
        var ids = new List<string>();
        for (var k = 1; k <= 3; k++)
        {
            // One shard as JSON Lines: merge reads either.
            var format = k == 2 ? "jsonl" : "json";
            var shard = await SweepAsync("--shard", $"{k}/3", "--format", format, "-o", folder.File($"s{k}.{format}"), "--min-coherent-accuracy", "0.75");
            Assert.True(shard.ExitCode is 0 or 1, shard.ToString());
            if (format == "json")
            {
                ids.AddRange(JsonNode.Parse(File.ReadAllText(folder.File($"s{k}.json")))!["claims"]!.AsArray().Select(c => (string)c!["id"]!));
            }
        }

        var merged = await Plumb.RunAsync("merge", folder.File("s3.json"), folder.File("s1.json"), folder.File("s2.jsonl"), "-o", folder.File("merged.json"));

        Assert.True(merged.ExitCode == 0, merged.ToString());
        Assert.Equal("plumb: merged 3 shard report(s): 12 of 12 claims judged", Assert.Single(merged.ErrorLines));
        var expected = ReportTimings.Without(File.ReadAllText(folder.File("all.json")));
        Assert.Equal(expected, ReportTimings.Without(File.ReadAllText(folder.File("merged.json"))));
        // Shard 1 and 3 hold claims of their own, none twice (shard 2 was checked through the merge).
        Assert.Equal(ids.Count, ids.Distinct().Count());
        Assert.Equal(12, JsonNode.Parse(expected)!["claims"]!.AsArray().Count);
    }

    [Theory]
    [InlineData("4/3", "--shard: '4/3': K must be from 1 to N (3)")]
    [InlineData("0/2", "--shard: '0/2': K must be from 1 to N (2)")]
    [InlineData("two", "--shard: 'two' is not K/N (shard K of N, for example 2/5)")]
    public async Task Sweep_BadShardSpec_OneLineExitTwo(string spec, string message)
    {
        var result = await SweepAsync("--shard", spec);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: " + message, Assert.Single(result.ErrorLines), StringComparison.Ordinal);
        Assert.Empty(result.Output);
    }

    [Fact]
    public async Task Merge_ShardsOfDifferentClaimFiles_OneLineNamingTheFileExitTwo()
    {
        using var folder = new TempDirectory();
        var fewer = folder.Write("fewer.jsonl", string.Join('\n', File.ReadLines(Sample("claims.jsonl")).Take(6)) + "\n");
        await SweepAsync("--shard", "1/2", "--format", "json", "-o", folder.File("a1.json"));
        await Plumb.RunAsync("sweep", fewer, "--model", "recording:" + Sample("recording.jsonl"), "--quiet", "--shard", "2/2", "--format", "json", "-o", folder.File("b2.json"));

        var result = await Plumb.RunAsync("merge", folder.File("a1.json"), folder.File("b2.json"), "-o", folder.File("merged.json"));

        Assert.Equal(2, result.ExitCode);
        var line = Assert.Single(result.ErrorLines);
        Assert.StartsWith($"plumb: {folder.File("b2.json")}: judged another claim input ({fewer}, sha256:", line, StringComparison.Ordinal);
        Assert.False(File.Exists(folder.File("merged.json")));
    }

    [Fact]
    public async Task Merge_ReportOfAnotherSchemaVersion_OneLineExitTwo()
    {
        using var folder = new TempDirectory();
        var old = folder.Write("old.json", "{\"schema_version\": 1, \"plumbline_version\": \"0.0.9\", \"claims\": []}\n");

        var result = await Plumb.RunAsync("merge", old, "-o", folder.File("merged.json"));

        Assert.Equal(2, result.ExitCode);
        Assert.Equal(
            $"plumb: {old}: report schema version 1; this plumb reads version 2 (read it with the plumb that wrote it, or run again)",
            Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Merge_NotJson_OneLineWithTheLineExitTwo()
    {
        using var folder = new TempDirectory();
        var broken = folder.Write("broken.json", "{\n  \"schema_version\": 2,\n  oops\n}\n");

        var result = await Plumb.RunAsync("merge", broken);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"plumb: {broken}:3: not valid JSON", Assert.Single(result.ErrorLines));
    }
}
