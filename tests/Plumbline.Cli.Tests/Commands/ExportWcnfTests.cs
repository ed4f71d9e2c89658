using System.Text.Json;
using Plumbline.Cli.Tests.Doubles;

namespace Plumbline.Cli.Tests.Commands;

public sealed class ExportWcnfTests
{
    [Fact]
    public async Task ExportWcnf_SolvingEachFile_GivesTheVerdictsObjectiveCost()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9), (TestClaims.Sun, 0.35));
        var export = folder.File("wcnf");

        var check = await Plumb.RunAsync("check", TestClaims.Bats, TestClaims.Sun, "--model", "recording:" + recording, "--format", "json", "--export-wcnf", export, "--weighting", "nli");

        Assert.True(check.ExitCode == 0, check.ToString());
        using var report = JsonDocument.Parse(check.Output);
        foreach (var id in new[] { "c1", "c2" })
        {
            var verdict = ReportJson.Claim(report, id);
            var file = Path.Combine(export, id + ".wcnf");
            var solve = await Plumb.RunAsync("solve", file, "--format", "json");
            Assert.True(solve.ExitCode == 0, solve.ToString());
            using var solved = JsonDocument.Parse(solve.Output);
            Assert.Equal("optimal", solved.RootElement.GetProperty("status").GetString());
            Assert.Equal(verdict.GetProperty("objective_cost").GetInt64(), solved.RootElement.GetProperty("cost").GetInt64());
            Assert.True(solved.RootElement.GetProperty("soft_clauses").GetInt32() > 0);
        }
    }

    [Fact]
    public async Task ExportWcnf_CommentsMapEveryVariableToItsStatement()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var export = folder.File("wcnf");

        var check = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + recording, "--format", "json", "--export-wcnf", export);

        Assert.True(check.ExitCode == 0, check.ToString());
        using var report = JsonDocument.Parse(check.Output);
        var kept = ReportJson.Claim(report, "c1").GetProperty("statements").EnumerateArray()
            .Where(s => s.GetProperty("kept").GetBoolean())
            .Select(s => $"statement #{s.GetProperty("id").GetInt32()}: {s.GetProperty("text").GetString()}")
            .ToList();
        var lines = File.ReadAllLines(Path.Combine(export, "c1.wcnf"));
        Assert.Equal($"c plumb claim c1: {TestClaims.Bats}", lines[0]);
        var variables = lines.Where(l => l.StartsWith("c variable ", StringComparison.Ordinal)).ToList();
        Assert.Equal(kept.Count, variables.Count);
        for (var v = 1; v <= variables.Count; v++)
        {
            Assert.StartsWith($"c variable {v} = statement #", variables[v - 1]);
        }

        Assert.Equal(kept.Order(), variables.Select(l => l[(l.IndexOf('=', StringComparison.Ordinal) + 2)..]).Order());
        Assert.Equal("c variable 1 = statement #0: " + TestClaims.Bats, variables[0]);
    }

    [Fact]
    public async Task ExportWcnf_FailedClaim_WritesNoFile()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var export = folder.File("wcnf");

        var check = await Plumb.RunAsync("check", TestClaims.Bats, TestClaims.Sun, "--model", "recording:" + recording, "--export-wcnf", export);

        Assert.Equal(3, check.ExitCode);
        Assert.Equal(["c1.wcnf"], Directory.GetFiles(export).Select(Path.GetFileName));
    }
}
