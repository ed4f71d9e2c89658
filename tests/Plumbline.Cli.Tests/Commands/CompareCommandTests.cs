using System.Text.Json;
using Plumbline.Cli.Tests.Doubles;
using Plumbline.Core.Coherence;
using Row = Plumbline.Cli.Tests.Doubles.CraftedReports.Row;

namespace Plumbline.Cli.Tests.Commands;

public sealed class CompareCommandTests
{
    /// <summary>
    /// Gold, old answer, new answer, by hand: c1 right both; c2, c3, c5, c8 right then wrong; c4 wrong then right;
    /// c6 wrong both but contested then overturned; c7 right both; c9 has no gold and flips; c10 only old, c11 only new.
    /// Correctness: 4 right-to-wrong against 1 wrong-to-right: p = 2 (C(5,0) + C(5,1)) / 2^5 = 12 / 32 = 0.375.
    /// Answers (c1..c9): true-to-false c2, c4, c5, c8, c9 = 5, false-to-true c3 = 1: p = 2 (1 + 6) / 2^6 = 0.21875.
    /// Coherent accuracy, c10 and c11 included: old 7 of 9 = 0.7778 (c1, c2, c3, c5, c7, c8, c10), new 4 of 9 = 0.4444
    /// (c1, c4, c7, c11); change -1/3.
    /// </summary>
    private static readonly Row[] Old =
    [
        new("c1", true, true), new("c2", true, true), new("c3", false, false), new("c4", false, true), new("c5", true, true),
        new("c6", true, false, ClaimStatus.Contested, 0.0), new("c7", false, false), new("c8", true, true), new("c9", null, true), new("c10", true, true),
    ];

    private static readonly Row[] New =
    [
        new("c1", true, true), new("c2", true, false), new("c3", false, true), new("c4", false, false), new("c5", true, false),
        new("c6", true, false, ClaimStatus.Overturned), new("c7", false, false), new("c8", true, false), new("c9", null, false), new("c11", true, true),
    ];

    [Fact]
    public async Task Compare_CraftedReports_HandComputedChangesAndMcNemar()
    {
        using var folder = new TempDirectory();
        var old = await CraftedReports.WriteAsync(folder.File("old.json"), Old);
        var now = await CraftedReports.WriteAsync(folder.File("new.json"), New);

        var result = await Plumb.RunAsync("compare", old, now, "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        Assert.Equal(["c2", "c3", "c4", "c5", "c6", "c8", "c9"], root.GetProperty("changes").EnumerateArray().Select(c => c.GetProperty("id").GetString()));
        var c6 = root.GetProperty("changes")[4];
        Assert.Equal(("contested", "overturned"), (c6.GetProperty("old_status").GetString(), c6.GetProperty("new_status").GetString()));
        Assert.Equal((9, "c10", "c11"), (root.GetProperty("paired").GetInt32(), root.GetProperty("only_old")[0].GetString(), root.GetProperty("only_new")[0].GetString()));
        var correctness = root.GetProperty("correctness");
        Assert.Equal((8, 4, 1), (correctness.GetProperty("pairs").GetInt32(), correctness.GetProperty("old_only").GetInt32(), correctness.GetProperty("new_only").GetInt32()));
        Assert.Equal(0.375, correctness.GetProperty("p_value").GetDouble(), 12);
        var answers = root.GetProperty("answers");
        Assert.Equal((9, 5, 1), (answers.GetProperty("pairs").GetInt32(), answers.GetProperty("old_only").GetInt32(), answers.GetProperty("new_only").GetInt32()));
        Assert.Equal(0.21875, answers.GetProperty("p_value").GetDouble(), 12);
        var accuracy = root.GetProperty("figures").GetProperty("coherent_accuracy");
        Assert.Equal((0.7778, 0.4444, -0.3333), (accuracy.GetProperty("old").GetDouble(), accuracy.GetProperty("new").GetDouble(), accuracy.GetProperty("change").GetDouble()));
        Assert.Empty(root.GetProperty("warnings").EnumerateArray());
        Assert.Equal(JsonValueKind.Null, root.GetProperty("gate").ValueKind);
    }

    [Fact]
    public async Task Compare_Text_ListsTheChangesAndTheTest()
    {
        using var folder = new TempDirectory();
        var old = await CraftedReports.WriteAsync(folder.File("old.json"), Old);
        var now = await CraftedReports.WriteAsync(folder.File("new.json"), New);

        var result = await Plumb.RunAsync("compare", old, now);

        Assert.Contains("Changed claims: 7 of 9 paired\n", result.Output, StringComparison.Ordinal);
        Assert.Contains("    c2  answer true -> false | gold right -> wrong\n", result.Output, StringComparison.Ordinal);
        Assert.Contains("    c6  status contested -> overturned\n", result.Output, StringComparison.Ordinal);
        Assert.Contains("paired correctness against gold over 8 claims: 4 right before and wrong now, 1 wrong before and right now; McNemar exact p = 0.3750\n", result.Output, StringComparison.Ordinal);
        Assert.Contains("Only in old: c10\nOnly in new: c11\n", result.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Compare_SignificantDrop_RegressionGateFailsExitOne()
    {
        // 12 claims right then wrong, 1 wrong then right, 7 right both: p = 2 (1 + 13) / 2^13 = 0.00341796875.
        var old = Enumerable.Range(1, 20).Select(i => new Row($"k{i}", true, i != 13)).ToArray();
        var now = Enumerable.Range(1, 20).Select(i => new Row($"k{i}", true, i > 12)).ToArray();
        using var folder = new TempDirectory();

        var result = await Plumb.RunAsync("compare", await CraftedReports.WriteAsync(folder.File("a.json"), old),
            await CraftedReports.WriteAsync(folder.File("b.json"), now), "--fail-on-regression", "0.05", "--format", "md");

        Assert.Equal(1, result.ExitCode);
        Assert.Contains("**Regression gate (alpha 0.05): fail.** 12 right before and wrong now, 1 wrong before and right now, McNemar p = 0.0034: accuracy fell, p below 0.05",
            result.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Compare_SameDropNotSignificantAtTheGivenLevel_Passes()
    {
        var old = Enumerable.Range(1, 20).Select(i => new Row($"k{i}", true, i != 13)).ToArray();
        var now = Enumerable.Range(1, 20).Select(i => new Row($"k{i}", true, i > 12)).ToArray();
        using var folder = new TempDirectory();

        var result = await Plumb.RunAsync("compare", await CraftedReports.WriteAsync(folder.File("a.json"), old),
            await CraftedReports.WriteAsync(folder.File("b.json"), now), "--fail-on-regression", "0.001");

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Contains("Regression gate (alpha 0.001): pass: ", result.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Compare_NoGold_GateUsesTheAnswers()
    {
        // No gold: 6 answers true then false, none the other way: p = 2 / 2^6 = 0.03125.
        var old = Enumerable.Range(1, 8).Select(i => new Row($"k{i}", null, true)).ToArray();
        var now = Enumerable.Range(1, 8).Select(i => new Row($"k{i}", null, i > 6)).ToArray();
        using var folder = new TempDirectory();

        var result = await Plumb.RunAsync("compare", await CraftedReports.WriteAsync(folder.File("a.json"), old),
            await CraftedReports.WriteAsync(folder.File("b.json"), now), "--fail-on-regression", "0.05", "--format", "json");

        Assert.Equal(1, result.ExitCode);
        using var json = JsonDocument.Parse(result.Output);
        Assert.Equal(JsonValueKind.Null, json.RootElement.GetProperty("correctness").ValueKind);
        Assert.Equal(0.03125, json.RootElement.GetProperty("gate").GetProperty("p_value").GetDouble(), 12);
        Assert.Equal(JsonValueKind.Null, json.RootElement.GetProperty("figures").GetProperty("coherent_accuracy").GetProperty("old").ValueKind);
    }

    [Fact]
    public async Task Compare_DifferentSettingsAndInput_WarnedInEveryFormatAndOnStandardError()
    {
        using var folder = new TempDirectory();
        var settings = CraftedReports.Settings with
        {
            ModelSource = "http://127.0.0.1:8080/v1 (model-b)",
            NliModel = "nli sha256:4567",
            Shape = new Core.Trees.TreeShape([Core.Trees.TreeShape.Default.Levels[0]]),
        };
        var old = await CraftedReports.WriteAsync(folder.File("old.json"), Old);
        var now = await CraftedReports.WriteAsync(folder.File("new.json"), New, settings, "sha256:" + new string('2', 64));

        foreach (var format in new[] { "text", "md", "json" })
        {
            var result = await Plumb.RunAsync("compare", old, now, "--format", format);

            Assert.True(result.ExitCode == 0, result.ToString());
            const string warning = "the runs used different settings (model_source: recording:demo.jsonl -> http://127.0.0.1:8080/v1 (model-b); " +
                "nli_model: nli sha256:0123 -> nli sha256:4567; tree_shape.max_depth: 2 -> 1; tree_shape.levels[1].depth: 2 -> none; ";
            Assert.Contains(warning, result.Output.Replace("\\u003E", ">", StringComparison.Ordinal), StringComparison.Ordinal);
            Assert.Contains("the runs read different claim inputs", result.Output, StringComparison.Ordinal);
            Assert.Equal(2, result.ErrorLines.Count);
            Assert.StartsWith("plumb: warning: " + warning, result.ErrorLines[0], StringComparison.Ordinal);
        }
    }

    [Fact]
    public async Task Compare_ReportOfAnotherSchemaVersion_OneLineExitTwo()
    {
        using var folder = new TempDirectory();
        var old = await CraftedReports.WriteAsync(folder.File("old.json"), Old);
        var now = folder.Write("new.json", File.ReadAllText(old).Replace("\"schema_version\": 2", "\"schema_version\": 1", StringComparison.Ordinal));

        var result = await Plumb.RunAsync("compare", old, now);

        Assert.Equal(2, result.ExitCode);
        Assert.Empty(result.Output);
        Assert.Equal($"plumb: {now}: report schema version 1; this plumb reads version 2 (read it with the plumb that wrote it, or run again)", Assert.Single(result.ErrorLines));
    }
}
