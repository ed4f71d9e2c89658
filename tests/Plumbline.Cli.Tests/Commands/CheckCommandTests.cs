using System.Text.Json;
using Plumbline.Cli.Tests.Doubles;

namespace Plumbline.Cli.Tests.Commands;

public sealed class CheckCommandTests
{
    [Theory]
    [InlineData("foo:bar", "plumb: --model: unknown model source 'foo:bar'")]
    [InlineData("recordings.jsonl", "plumb: --model: unknown model source 'recordings.jsonl'")]
    [InlineData("recording:", "plumb: --model: 'recording:' needs the recording file's path")]
    public async Task Check_UnknownModelSource_ExitsTwoWithOneLine(string source, string expected)
    {
        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", source);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith(expected, Assert.Single(result.ErrorLines));
        Assert.Empty(result.Output);
    }

    [Fact]
    public async Task Check_NoModelSource_ExitsTwo()
    {
        var result = await Plumb.RunAsync("check", TestClaims.Bats);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: --model: missing", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Check_MissingRecordingFile_ExitsTwo()
    {
        using var folder = new TempDirectory();
        var path = folder.File("absent.jsonl");

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + path);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"plumb: --model: recording file '{path}' not found", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Check_MalformedRecording_ExitsTwoNamingFileLineAndField()
    {
        using var folder = new TempDirectory();
        var path = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var lines = File.ReadAllLines(path).ToList();
        lines.Insert(1, "{\"request\":{\"kind\":\"answer\",\"statement\":\"x\",\"prompt_version\":\"1\"},\"response\":{\"p_true\":\"high\",\"p_false\":0.1}}");
        File.WriteAllLines(path, lines);

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + path);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"plumb: {path}:2: response.p_true:", Assert.Single(result.ErrorLines));
        Assert.Empty(result.Output);
    }

    [Theory]
    [InlineData("")]
    [InlineData("   ")]
    public async Task Check_EmptyClaim_ExitsTwo(string claim)
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));

        var result = await Plumb.RunAsync("check", TestClaims.Bats, claim, "--model", "recording:" + recording);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal("plumb: claim c2 (argument 2): empty; give the statement to judge", Assert.Single(result.ErrorLines));
        Assert.Empty(result.Output);
    }

    [Theory]
    [InlineData("--negation", "sometimes")]
    [InlineData("--weighting", "heavy")]
    [InlineData("--contested-at", "-0.5")]
    [InlineData("--contested-at", "much")]
    [InlineData("--format", "xml")]
    public async Task Check_BadOptionValue_ExitsTwoWithOneLine(string option, string value)
    {
        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:x.jsonl", option, value);

        Assert.Equal(2, result.ExitCode);
        var line = Assert.Single(result.ErrorLines);
        Assert.StartsWith("plumb: ", line);
        Assert.Contains(value, line);
    }

    [Fact]
    public async Task Check_NliModelFolderWithoutModel_ExitsTwoNamingTheFile()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var nli = Directory.CreateDirectory(folder.File("nli")).FullName;

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + recording, "--nli-model", nli);

        Assert.Equal(2, result.ExitCode);
        var line = Assert.Single(result.ErrorLines);
        Assert.StartsWith($"plumb: {nli}", line);
        Assert.Empty(result.Output);
    }

    [Fact]
    public async Task Check_MissingNliFolder_ExitsTwo()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var nli = folder.File("no-such-model");

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + recording, "--nli-model", nli);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"plumb: --nli-model: folder '{nli}' not found", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Check_AllRecorded_ExitsZeroWithAVerdictPerClaim()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9), (TestClaims.Sun, 0.2));

        var result = await Plumb.RunAsync("check", TestClaims.Bats, TestClaims.Sun, "--model", "recording:" + recording, "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Empty(result.Error);
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["c1", "c2"], ReportJson.Ids(report));
        Assert.Equal(TestClaims.Bats, ReportJson.Claim(report, "c1").GetProperty("claim").GetString());
        // The scripted beliefs make the direct answers true for c1 and false for c2.
        Assert.True(ReportJson.Claim(report, "c1").GetProperty("direct_answer").GetBoolean());
        Assert.False(ReportJson.Claim(report, "c2").GetProperty("direct_answer").GetBoolean());
        Assert.All(ReportJson.Ids(report), id => Assert.NotEqual("failed", ReportJson.Status(report, id)));
        Assert.Equal("recording:rec.jsonl", report.RootElement.GetProperty("settings").GetProperty("model_source").GetString());
    }

    [Fact]
    public async Task Check_TextFormat_WritesTheTextReport()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + recording);

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Contains(TestClaims.Bats, result.Output);
        Assert.DoesNotContain("\u001b[", result.Output);
    }

    [Fact]
    public async Task Check_MissingRecordingEntry_ExitsThreeAndStillWritesTheVerdicts()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));

        var result = await Plumb.RunAsync("check", TestClaims.Bats, TestClaims.Sun, "--model", "recording:" + recording, "--format", "json");

        Assert.True(result.ExitCode == 3, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["c1", "c2"], ReportJson.Ids(report));
        Assert.NotEqual("failed", ReportJson.Status(report, "c1"));
        Assert.Equal("failed", ReportJson.Status(report, "c2"));
        Assert.Contains(TestClaims.Sun, ReportJson.Claim(report, "c2").GetProperty("error").GetString());
        var line = Assert.Single(result.ErrorLines);
        Assert.StartsWith("plumb: claim c2: ", line);
    }

    [Fact]
    public async Task Check_OutputFile_WritesTheReportThereAndNothingToStandardOutput()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var output = folder.File("report.json");

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + recording, "--format", "json", "--output", output);

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Empty(result.Output);
        using var report = JsonDocument.Parse(File.ReadAllText(output));
        Assert.Equal(["c1"], ReportJson.Ids(report));
    }

    [Fact]
    public async Task Check_OutputIntoMissingFolder_ExitsTwoBeforeJudging()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        var output = Path.Combine(folder.Path, "missing", "report.json");

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + recording, "--output", output);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: --output: folder ", Assert.Single(result.ErrorLines));
    }
}
