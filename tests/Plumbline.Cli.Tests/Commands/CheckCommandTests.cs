using System.Text.Json;
using Plumbline.Cli.Tests.Doubles;
using Plumbline.Core.Coherence;

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
    [InlineData("--integrity-gap", "1.5")]
    [InlineData("--integrity-gap", "-0.1")]
    [InlineData("--belief-form", "cube")]
    [InlineData("--link-floor", "1.2")]
    [InlineData("--conflicts", "ignore")]
    [InlineData("--contradictions", "twice")]
    [InlineData("--nli-text", "negation")]
    [InlineData("--cut-off", "trim")]
    [InlineData("--integral-claim", "skip")]
    [InlineData("--claim-belief", "yes")]
    [InlineData("--direct-answer", "guess")]
    [InlineData("--samples", "0")]
    [InlineData("--samples", "2.5")]
    public async Task Check_BadOptionValue_ExitsTwoWithOneLine(string option, string value)
    {
        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:x.jsonl", option, value);

        Assert.Equal(2, result.ExitCode);
        var line = Assert.Single(result.ErrorLines);
        Assert.StartsWith("plumb: ", line);
        Assert.Contains(value, line);
    }

    [Fact]
    public async Task Check_EngineRuleOptions_ReachTheEngineAndTheReport()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));

        var result = await Plumb.RunAsync(
            "check", TestClaims.Bats, "--model", "recording:" + recording, "--format", "json",
            "--integrity-gap", "0.05", "--belief-form", "normalised-difference", "--link-floor", "0.6", "--conflicts", "drop",
            "--contradictions", "once-per-pair", "--nli-text", "negation-when-false", "--cut-off", "keep",
            "--integral-claim", "stop", "--claim-belief", "on", "--direct-answer", "paired");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        var rules = report.RootElement.GetProperty("settings").GetProperty("rules");
        Assert.Equal(0.05, rules.GetProperty("integrity_gap").GetDouble());
        Assert.Equal("normalised_difference", rules.GetProperty("belief_form").GetString());
        Assert.Equal(0.6, rules.GetProperty("link_floor").GetDouble());
        Assert.Equal(("drop", "once_per_pair", "negation_when_false"), (rules.GetProperty("conflicts").GetString(), rules.GetProperty("contradictions").GetString(), rules.GetProperty("nli_text").GetString()));
        Assert.Equal((false, false, true), (rules.GetProperty("discard_cut_off").GetBoolean(), rules.GetProperty("expand_integral_claim").GetBoolean(), rules.GetProperty("claim_belief").GetBoolean()));
        Assert.Equal("paired", rules.GetProperty("direct_answer").GetString());
        // The claim (0.9 against 0.1 for its negation) is integral at once, so with --integral-claim stop it is
        // answered by its own belief: one statement, nothing explained.
        var claim = ReportJson.Claim(report, "c1");
        Assert.Equal(1, claim.GetProperty("statements").GetArrayLength());
        Assert.True(claim.GetProperty("answer").GetBoolean());
    }

    [Fact]
    public async Task Check_ThreeSampledTrees_StabilityInTheReport()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), CoherenceOptions.Default with { Samples = 3 }, (TestClaims.Bats, 0.9));

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:" + recording, "--format", "json", "--samples", "3");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        // The scripted model writes the same explanations for every sample, so all three trees agree.
        var stability = ReportJson.Claim(report, "c1").GetProperty("stability");
        Assert.Equal((3, 3, false), (stability.GetProperty("trees").GetInt32(), stability.GetProperty("agreeing").GetInt32(), stability.GetProperty("tied").GetBoolean()));
        Assert.Equal(1.0, report.RootElement.GetProperty("figures").GetProperty("mean_stability").GetDouble());
        Assert.Equal(3, report.RootElement.GetProperty("settings").GetProperty("rules").GetProperty("samples").GetInt32());
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
