using System.Text.Json;
using Plumbline.Cli.Tests.EndToEnd;

namespace Plumbline.Cli.Tests.Commands;

public sealed class NliCommandTests
{
    [Fact]
    public async Task Nli_Pair_PrintsThreeProbabilitiesAndTheirArgmaxLabel()
    {
        var result = await Plumb.RunAsync("nli", "A man is playing a guitar on stage.", "A man is playing an instrument.", "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        var scores = new Dictionary<string, double>
        {
            ["entailment"] = root.GetProperty("entailment").GetDouble(),
            ["neutral"] = root.GetProperty("neutral").GetDouble(),
            ["contradiction"] = root.GetProperty("contradiction").GetDouble(),
        };
        Assert.All(scores.Values, p => Assert.InRange(p, 0.0, 1.0));
        Assert.Equal(1.0, scores.Values.Sum(), 1e-5);
        Assert.Equal(scores.MaxBy(s => s.Value).Key, root.GetProperty("label").GetString());
        Assert.False(root.GetProperty("truncated").GetBoolean());
    }

    [Fact]
    public async Task Nli_TextFormat_ShowsEachProbabilityAndTheLabel()
    {
        var result = await Plumb.RunAsync("nli", "The cat sleeps.", "The cat is awake.");

        Assert.True(result.ExitCode == 0, result.ToString());
        var rows = result.Output.Split('\n');
        Assert.Single(rows, r => r.StartsWith("entailment ", StringComparison.Ordinal));
        Assert.Single(rows, r => r.StartsWith("neutral ", StringComparison.Ordinal));
        Assert.Single(rows, r => r.StartsWith("contradiction ", StringComparison.Ordinal));
        Assert.Single(rows, r => r.StartsWith("label ", StringComparison.Ordinal));
    }

    [Fact]
    public async Task Nli_OnlyOneSentence_ExitsTwo()
    {
        var result = await Plumb.RunAsync("nli", "The cat sleeps.");

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: nli: ", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Nli_ModelFolderWithoutModelFiles_ExitsTwoNamingTheFile()
    {
        using var folder = new TempDirectory();

        var result = await Plumb.RunAsync("nli", "a", "b", "--nli-model", folder.Path);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: " + folder.Path, Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Nli_SentencePieceModelFolder_ScoresThePairWithThatModel()
    {
        // A tiny random-weight XLM-R shaped export (models/tiny-nli/xlm-roberta, made by models/tiny-nli/build.py).
        var folder = Path.Combine(SampleSweep.RepositoryRoot, "models", "tiny-nli", "xlm-roberta");

        var result = await Plumb.RunAsync("nli", "The ferry leaves at 07:45.", "The ferry leaves in the morning.", "--nli-model", folder, "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        var total = root.GetProperty("entailment").GetDouble() + root.GetProperty("neutral").GetDouble() + root.GetProperty("contradiction").GetDouble();
        Assert.Equal(1.0, total, 1e-5);
    }

    [Fact]
    public async Task Nli_SentencePieceFolderWithABrokenModelFile_ExitsTwoNamingTheFile()
    {
        using var folder = new TempDirectory();
        var source = Path.Combine(SampleSweep.RepositoryRoot, "models", "tiny-nli", "deberta-v3");
        foreach (var file in Directory.GetFiles(source))
        {
            File.Copy(file, folder.File(Path.GetFileName(file)));
        }

        var broken = folder.Write("spm.model", "not a SentencePiece model");

        var result = await Plumb.RunAsync("nli", "a", "b", "--nli-model", folder.Path);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: " + broken + ": ", Assert.Single(result.ErrorLines));
    }

    private static string EvalFile(TempDirectory folder)
    {
        var longPremise = string.Join(' ', Enumerable.Repeat("the kettle is made of steel and glass", 60));
        string Row(string premise, string hypothesis, string label) =>
            JsonSerializer.Serialize(new Dictionary<string, string> { ["premise"] = premise, ["hypothesis"] = hypothesis, ["label"] = label });
        return folder.Write("pairs.jsonl", string.Join('\n',
            Row("A man is playing a guitar on stage.", "A man is playing an instrument.", "entailment"),
            Row("Two dogs run through a field.", "Animals are outside.", "entailment"),
            Row("A woman is reading a book.", "The woman is reading a novel by her favourite author.", "neutral"),
            Row(longPremise, "The kettle was bought last year.", "neutral"),
            Row("A child is sleeping in bed.", "The child is running in the park.", "contradiction"),
            Row("The shop is closed on Sundays.", "The shop is open on Sundays.", "contradiction"),
            Row("A cat sits on the mat.", "A cat is on the mat.", "-")));
    }

    /// <summary><c>plumb nli --eval</c> on <see cref="EvalFile"/> with JSON output; the command must succeed.</summary>
    private static async Task<JsonDocument> EvalJsonAsync()
    {
        using var folder = new TempDirectory();
        var result = await Plumb.RunAsync("nli", "--eval", EvalFile(folder), "--format", "json");
        Assert.True(result.ExitCode == 0, result.ToString());
        return JsonDocument.Parse(result.Output);
    }

    [Fact]
    public async Task NliEval_LabelledPairs_ReportsConsistentCountsAccuracyAndTruncation()
    {
        using var json = await EvalJsonAsync();
        var root = json.RootElement;
        Assert.Equal(6, root.GetProperty("pairs").GetInt32());
        Assert.Equal(1, root.GetProperty("skipped_unlabelled").GetInt32());
        Assert.Equal(1, root.GetProperty("truncated").GetInt32());
        var labels = new[] { "entailment", "neutral", "contradiction" };
        var confusion = root.GetProperty("confusion");
        int Cell(string gold, string predicted) => confusion.GetProperty(gold).GetProperty(predicted).GetInt32();
        // Two pairs of each gold class in the file.
        Assert.All(labels, gold => Assert.Equal(2, labels.Sum(predicted => Cell(gold, predicted))));
        var correct = labels.Sum(label => Cell(label, label));
        Assert.Equal(correct, root.GetProperty("correct").GetInt32());
        Assert.Equal(correct / 6.0, root.GetProperty("accuracy").GetDouble(), 9);
        Assert.True(root.GetProperty("pairs_per_second").GetDouble() > 0);
        foreach (var metrics in root.GetProperty("classes").EnumerateArray())
        {
            var label = metrics.GetProperty("label").GetString()!;
            var predicted = labels.Sum(gold => Cell(gold, label));
            Assert.Equal(predicted, metrics.GetProperty("predicted").GetInt32());
            Assert.Equal(2, metrics.GetProperty("gold").GetInt32());
            Assert.Equal(Cell(label, label) / 2.0, metrics.GetProperty("recall").GetDouble(), 9);
            if (predicted > 0)
            {
                Assert.Equal((double)Cell(label, label) / predicted, metrics.GetProperty("precision").GetDouble(), 9);
            }
            else
            {
                Assert.Equal(JsonValueKind.Null, metrics.GetProperty("precision").ValueKind);
            }
        }
    }

    [Fact]
    public async Task NliEval_FalseContradictionRate_IsContradictionReadingsOfNonContradictionGold()
    {
        using var json = await EvalJsonAsync();
        var root = json.RootElement;
        var confusion = root.GetProperty("confusion");
        var wrong = confusion.GetProperty("entailment").GetProperty("contradiction").GetInt32()
            + confusion.GetProperty("neutral").GetProperty("contradiction").GetInt32();
        Assert.Equal(wrong, root.GetProperty("false_contradictions").GetInt32());
        // Four of the six labelled pairs are entailment or neutral.
        Assert.Equal(wrong / 4.0, root.GetProperty("false_contradiction_rate").GetDouble(), 9);
        Assert.InRange(root.GetProperty("calibration_error").GetDouble(), 0.0, 1.0);
    }

    [Fact]
    public async Task NliEval_SeveralFiles_OneResultPerFileInOrderAndASummaryTable()
    {
        using var folder = new TempDirectory();
        var mixed = EvalFile(folder);
        var contradictions = folder.Write("contradictions.csv",
            "sentence1,sentence2,label\n\"A child is sleeping in bed.\",\"The child is running in the park.\",contradiction\n\"The shop is closed on Sundays.\",\"The shop is open on Sundays.\",contradiction\n");

        var json = await Plumb.RunAsync("nli", "--eval", mixed, contradictions, "--format", "json");
        var text = await Plumb.RunAsync("nli", "--eval", mixed, contradictions);

        Assert.True(json.ExitCode == 0, json.ToString());
        using var document = JsonDocument.Parse(json.Output);
        var files = document.RootElement.EnumerateArray().ToArray();
        Assert.Equal([mixed, contradictions], files.Select(f => f.GetProperty("file").GetString()));
        Assert.Equal([6, 2], files.Select(f => f.GetProperty("pairs").GetInt32()));
        // With no gold entailment or neutral pair there is no false-contradiction rate to give.
        Assert.Equal(JsonValueKind.Null, files[1].GetProperty("false_contradiction_rate").ValueKind);
        Assert.True(text.ExitCode == 0, text.ToString());
        Assert.Matches(@"(?m)^pairs\.jsonl\s+6\s+[01]\.\d{4}\s+[01]\.\d{4}\s+[01]\.\d{4}$", text.Output);
        Assert.Matches(@"(?m)^contradictions\.csv\s+2\s+[01]\.\d{4}\s+-\s+[01]\.\d{4}$", text.Output);
    }

    [Fact]
    public async Task NliEval_BadRowInALaterFile_FailsNamingThatFileBeforeAnyScoring()
    {
        using var folder = new TempDirectory();
        var good = EvalFile(folder);
        var bad = folder.Write("bad.csv", "sentence1,sentence2,label\nA cat sits.,A cat is sitting.,maybe\n");

        var result = await Plumb.RunAsync("nli", "--eval", good, bad);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"plumb: {bad}:2: label: ", Assert.Single(result.ErrorLines));
        Assert.DoesNotContain("nli evaluation of", result.Output);
    }

    [Fact]
    public async Task NliEval_TextFormat_ShowsAccuracyClassesConfusionSpeedAndTruncation()
    {
        using var folder = new TempDirectory();
        var file = EvalFile(folder);

        var result = await Plumb.RunAsync("nli", "--eval", file);

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Contains("pairs      6 (1 unlabelled skipped, 1 truncated to the model's maximum length)", result.Output);
        Assert.Matches(@"accuracy   [01]\.\d{4} \(\d/6\)", result.Output);
        Assert.Contains("confusion (rows: gold, columns: predicted)", result.Output);
        Assert.Matches(@"speed      \d+\.\d pairs/s", result.Output);
        Assert.Matches(@"false contradiction  [01]\.\d{4} \(\d of 4 pairs whose gold is not contradiction\)", result.Output);
        Assert.Matches(@"calibration error    [01]\.\d{4} ", result.Output);
    }

    [Fact]
    public async Task NliEval_MalformedRow_ExitsTwoNamingFileLineAndField()
    {
        using var folder = new TempDirectory();
        var file = folder.Write("pairs.jsonl", "{\"premise\": \"a\", \"hypothesis\": \"b\", \"label\": \"entailment\"}\n{\"premise\": \"a\", \"hypothesis\": \"b\", \"label\": \"maybe\"}\n");

        var result = await Plumb.RunAsync("nli", "--eval", file);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"plumb: {file}:2: label: ", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task NliEval_WithAPairToo_ExitsTwo()
    {
        using var folder = new TempDirectory();
        var file = EvalFile(folder);

        var result = await Plumb.RunAsync("nli", "a", "b", "--eval", file);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal("plumb: nli: give either a premise and a hypothesis, or --eval FILE..., not both", Assert.Single(result.ErrorLines));
    }
}
