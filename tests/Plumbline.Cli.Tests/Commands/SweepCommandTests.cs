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
    public async Task Sweep_BadLine_ReportedSkippedAndTheOthersJudgedExitThree()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9), (TestClaims.Sun, 0.2));
        var claims = folder.Write("claims.jsonl",
            $"{{\"id\": \"sun\", \"claim\": \"{TestClaims.Sun}\", \"gold\": \"maybe\"}}\n{{\"id\": \"bats\", \"claim\": \"{TestClaims.Bats}\"}}\n");

        var result = await Plumb.RunAsync("sweep", claims, "--model", "recording:" + recording, "--format", "json");

        Assert.True(result.ExitCode == 3, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["bats"], ReportJson.Ids(report));
        Assert.NotEqual("failed", ReportJson.Status(report, "bats"));
        var problem = Assert.Single(report.RootElement.GetProperty("completion").GetProperty("problems").EnumerateArray());
        Assert.Equal($"{claims}:1: gold: unknown label 'maybe' (use true, false, yes, no, 1 or 0, or leave it out)", problem.GetProperty("message").GetString());
        Assert.Equal($"plumb: {claims}:1: gold: unknown label 'maybe' (use true, false, yes, no, 1 or 0, or leave it out)", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Sweep_BadLineWithStrictInput_ExitsTwoAndJudgesNothing()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var claims = folder.Write("claims.jsonl", $"{{\"claim\": \"{TestClaims.Bats}\"}}\n{{\"id\": \"bats\"}}\n");

        var result = await Plumb.RunAsync("sweep", claims, "--model", "recording:" + recording, "--format", "json", "--strict-input");

        Assert.Equal(2, result.ExitCode);
        Assert.Empty(result.Output);
        Assert.Equal(
            [$"plumb: {claims}:2: claim: missing or empty", $"plumb: {claims}: 1 bad line(s); nothing was judged (--strict-input)"],
            result.ErrorLines);
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
