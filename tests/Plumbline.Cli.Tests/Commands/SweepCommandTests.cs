using System.Text.Json;
using Plumbline.Cli.Tests.Doubles;

namespace Plumbline.Cli.Tests.Commands;

public sealed class SweepCommandTests
{
    [Fact]
    public async Task Sweep_JsonLines_JudgesEveryClaimWithGoldAndTags()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9), (TestClaims.Sun, 0.2));
        var claims = folder.Write("claims.jsonl",
            $"{{\"id\": \"bats\", \"claim\": \"{TestClaims.Bats}\", \"gold\": true, \"tags\": [\"animals\"]}}\n{{\"id\": \"sun\", \"claim\": \"{TestClaims.Sun}\", \"gold\": false}}\n");

        var result = await Plumb.RunAsync("sweep", claims, "--model", "recording:" + recording, "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["bats", "sun"], ReportJson.Ids(report));
        Assert.True(ReportJson.Claim(report, "bats").GetProperty("gold").GetBoolean());
        Assert.Equal("animals", ReportJson.Claim(report, "bats").GetProperty("tags")[0].GetString());
        Assert.Equal(2, report.RootElement.GetProperty("figures").GetProperty("labelled").GetInt32());
    }

    [Fact]
    public async Task Sweep_PlainText_UsesLineNumbersAsIds()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9), (TestClaims.Sun, 0.2));
        var claims = folder.Write("claims.txt", $"{TestClaims.Bats}\n\n{TestClaims.Sun}\n");

        var result = await Plumb.RunAsync("sweep", claims, "--model", "recording:" + recording, "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["1", "3"], ReportJson.Ids(report));
    }

    [Fact]
    public async Task Sweep_BadLineAfterJudgedClaims_ExitsThreeAndReportsWhatWasJudged()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9), (TestClaims.Sun, 0.2));
        var claims = folder.Write("claims.jsonl",
            $"{{\"id\": \"bats\", \"claim\": \"{TestClaims.Bats}\"}}\n{{\"id\": \"sun\", \"claim\": \"{TestClaims.Sun}\", \"gold\": \"no\"}}\n");

        var result = await Plumb.RunAsync("sweep", claims, "--model", "recording:" + recording, "--format", "json");

        Assert.True(result.ExitCode == 3, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["bats"], ReportJson.Ids(report));
        Assert.NotEqual("failed", ReportJson.Status(report, "bats"));
        var line = Assert.Single(result.ErrorLines);
        Assert.StartsWith($"plumb: {claims}:2: gold: expected true, false or null, found a string", line);
        Assert.EndsWith("stopped after 1 claim(s)", line);
    }

    [Fact]
    public async Task Sweep_BadFirstLine_ExitsTwoAndWritesNoReport()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var claims = folder.Write("claims.jsonl", $"{{\"id\": \"bats\"}}\n{{\"claim\": \"{TestClaims.Bats}\"}}\n");

        var result = await Plumb.RunAsync("sweep", claims, "--model", "recording:" + recording, "--format", "json");

        Assert.Equal(2, result.ExitCode);
        Assert.Empty(result.Output);
        Assert.Equal($"plumb: {claims}:1: claim: missing or empty", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Sweep_MissingClaimFile_ExitsTwo()
    {
        using var folder = new TempDirectory();
        var claims = folder.File("absent.jsonl");

        var result = await Plumb.RunAsync("sweep", claims, "--model", "recording:x.jsonl");

        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"plumb: {claims}: claim file not found", Assert.Single(result.ErrorLines));
    }
}
