using System.Text.Json;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Tests.Doubles;

namespace Plumbline.Cli.Tests.Input;

/// <summary>
/// Every file of data/bad-input (described in its README) through <c>plumb sweep</c>: each gives its documented
/// one-line message naming file, line and field, and the good lines are still judged. A scripted model answers
/// any claim and the NLI model is a neutral double, so only the input handling is under test.
/// </summary>
public sealed class BadInputCorpusTests
{
    private static readonly CompositionRoot AnyClaim = new()
    {
        OpenModel = (_, _, _) => Task.FromResult(Plumbline.Core.Language.Sources.OpenedModel.Stored(
            new ScriptedLanguageModel(new Dictionary<string, double>(), anyOtherClaim: 0.7), new Plumbline.Core.Language.ModelIdentity("scripted", "scripted"))),
        OpenScorer = _ => new NeutralScorer(),
    };

    public static TheoryData<string, string[], string[]> Corpus => new()
    {
        { "invalid-json.jsonl", [":2: invalid JSON at byte 35 of the line"], ["a", "c"] },
        { "bom.jsonl", [], ["a", "b"] },
        { "duplicate-ids.jsonl", [":3: id: duplicate id 'a' (first used on line 1)"], ["a", "b"] },
        {
            "broken-quoting.csv",
            [
                ":3: claim: quote inside an unquoted field (quote the whole field and double the quote)",
                ":5: claim: unterminated quoted field: its closing quote is missing, so it runs to the end of the input",
            ],
            ["k1", "k3"]
        },
        { "unknown-gold.jsonl", [":1: gold: unknown label 'maybe' (use true, false, yes, no, 1 or 0, or leave it out)"], ["b"] },
        { "unknown-gold.csv", [":3: gold: unknown label 'sometimes' (use true, false, yes, no, 1 or 0, or leave it out)"], ["a"] },
        { "crlf.csv", [], ["a", "b"] },
    };

    private static string CorpusFile(string name) => Path.Combine(AppContext.BaseDirectory, "data", "bad-input", name);

    private static async Task<PlumbResult> SweepAsync(string path, params string[] more) =>
        await Plumb.RunAsync(AnyClaim, ["sweep", path, "--model", "recording:unused", "--format", "json", "--quiet", .. more]);

    [Theory]
    [MemberData(nameof(Corpus))]
    public async Task Sweep_CorpusFile_DocumentedMessagesAndTheGoodLinesJudged(string name, string[] messages, string[] judged)
    {
        var path = CorpusFile(name);

        var result = await SweepAsync(path);

        Assert.True(result.ExitCode == (messages.Length == 0 ? 0 : 3), result.ToString());
        Assert.Equal(messages.Select(m => $"plumb: {path}{m}"), result.ErrorLines);
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(judged, ReportJson.Ids(report));
        Assert.All(judged, id => Assert.NotEqual("failed", ReportJson.Status(report, id)));
        Assert.Equal(messages.Select(m => path + m),
            report.RootElement.GetProperty("completion").GetProperty("problems").EnumerateArray().Select(p => p.GetProperty("message").GetString()));
    }

    [Fact]
    public async Task Sweep_CrlfCsv_QuotedCommaKeptAndGoldRead()
    {
        var result = await SweepAsync(CorpusFile("crlf.csv"));

        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal("The toaster, sold online, has two slots.", ReportJson.Claim(report, "b").GetProperty("claim").GetString());
        Assert.False(ReportJson.Claim(report, "b").GetProperty("gold").GetBoolean());
    }

    [Fact]
    public async Task Sweep_EmptyFile_ExitsTwoSayingSo()
    {
        var path = CorpusFile("empty.jsonl");

        var result = await SweepAsync(path);

        Assert.Equal(2, result.ExitCode);
        Assert.Empty(result.Output);
        Assert.Equal($"plumb: {path}:1: the input holds no claim", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Sweep_OneMegabyteLine_RefusedAndTheOthersJudged()
    {
        using var folder = new TempDirectory();
        var huge = "{\"id\": \"b\", \"claim\": \"" + new string('x', 1_048_576 - 24) + "\"}";
        Assert.Equal(1_048_576, huge.Length);
        var path = folder.Write("long-line.jsonl", $"{{\"id\": \"a\", \"claim\": \"The kettle boils water.\"}}\n{huge}\n{{\"id\": \"c\", \"claim\": \"The toaster has two slots.\"}}\n");

        var result = await SweepAsync(path);

        Assert.True(result.ExitCode == 3, result.ToString());
        Assert.Equal($"plumb: {path}:2: line is 1048576 characters long; the limit is 65536", Assert.Single(result.ErrorLines));
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["a", "c"], ReportJson.Ids(report));
    }

    [Fact]
    public async Task Sweep_StrictInput_EveryProblemListedNothingJudged()
    {
        var path = CorpusFile("broken-quoting.csv");

        var result = await SweepAsync(path, "--strict-input");

        Assert.Equal(2, result.ExitCode);
        Assert.Empty(result.Output);
        Assert.Equal(3, result.ErrorLines.Count);
        Assert.Equal($"plumb: {path}: 2 bad line(s); nothing was judged (--strict-input)", result.ErrorLines[^1]);
    }
}
