using System.Text.Json;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Tests.Doubles;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Reports;
using Plumbline.Reports.Model;

namespace Plumbline.Cli.Tests.Running;

/// <summary>How a judging run behaves when parts of it fail, composed with doubles through the composition root.</summary>
public sealed class RunBehaviourTests
{
    private static CompositionRoot Root(IEntailmentScorer? scorer = null, ReportWriterRegistry? reports = null) => new()
    {
        OpenModel = (_, _, _) => Task.FromResult(Plumbline.Core.Language.Sources.OpenedModel.Stored(
            new ScriptedLanguageModel(new Dictionary<string, double>(), anyOtherClaim: 0.7), new ModelIdentity("scripted", "scripted"))),
        OpenScorer = _ => scorer ?? new NeutralScorer(),
        Reports = reports ?? ReportWriterRegistry.Default,
    };

    private static string[] Check(params string[] more) =>
        ["check", "The kettle boils water.", "The toaster has two slots.", "--model", "recording:unused", "--quiet", .. more];

    [Fact]
    public async Task Run_OneReportWriterThrows_TheOthersAreWrittenAndTheRunIsIncomplete()
    {
        using var folder = new TempDirectory();
        var reports = ReportWriterRegistry.Default.With("broken", _ => new ThrowingWriter());
        var json = folder.File("report.json");

        var result = await Plumb.RunAsync(Root(reports: reports), Check("--report", "broken:" + folder.File("broken.out"), "--report", "json:" + json, "--report", "md"));

        Assert.Equal(3, result.ExitCode);
        Assert.Equal($"plumb: report broken to {folder.File("broken.out")} failed: the disk is full", Assert.Single(result.ErrorLines));
        using var report = JsonDocument.Parse(File.ReadAllText(json));
        Assert.Equal(["c1", "c2"], ReportJson.Ids(report));
        Assert.Contains("| figure | value |", result.Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Run_UnknownExceptionInTheScorer_ABugStopsTheRunWithAHintAndTheReportIsWritten()
    {
        var result = await Plumb.RunAsync(Root(scorer: new BrokenScorer()), Check("--format", "json", "--in-flight", "1"));

        Assert.Equal(3, result.ExitCode);
        Assert.Equal(
            [
                "plumb: internal error while judging claim c1: InvalidOperationException: scores out of step; 0 claim(s) finished, 2 not judged",
                "plumb: internal error: InvalidOperationException: scores out of step (run with --debug for the stack trace)",
            ],
            result.ErrorLines);
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["c1", "c2"], report.RootElement.GetProperty("completion").GetProperty("not_judged").EnumerateArray().Select(e => e.GetString()));
    }

    [Fact]
    public async Task Run_BugWithDebug_ShowsTheStackTrace()
    {
        var result = await Plumb.RunAsync(Root(scorer: new BrokenScorer()), Check("--format", "json", "--debug"));

        Assert.Equal(3, result.ExitCode);
        Assert.Contains("System.InvalidOperationException: scores out of step", result.Error, StringComparison.Ordinal);
        Assert.Contains($"at {typeof(BrokenScorer).FullName!.Replace('+', '.')}.ScoreAsync", result.Error, StringComparison.Ordinal);
        Assert.DoesNotContain("--debug for the stack trace", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Run_Verbose_EveryPairListed()
    {
        var quiet = await Plumb.RunAsync(Root(), Check("--format", "json"));
        var verbose = await Plumb.RunAsync(Root(), Check("--format", "json", "--verbose"));

        using var linked = JsonDocument.Parse(quiet.Output);
        using var all = JsonDocument.Parse(verbose.Output);
        Assert.Equal("linked", linked.RootElement.GetProperty("settings").GetProperty("pairs_listed").GetString());
        Assert.Equal("all", all.RootElement.GetProperty("settings").GetProperty("pairs_listed").GetString());
        // The neutral scorer finds no link, so only the verbose report lists pairs: n kept statements give n(n-1)/2.
        var claim = ReportJson.Claim(all, "c1");
        var kept = claim.GetProperty("counts").GetProperty("kept").GetInt32();
        Assert.Equal(kept * (kept - 1) / 2, claim.GetProperty("pairs").GetArrayLength());
        Assert.Equal(0, ReportJson.Claim(linked, "c1").GetProperty("pairs").GetArrayLength());
    }

    [Fact]
    public async Task Run_FormatShorthandBesideReport_BothWritten()
    {
        using var folder = new TempDirectory();
        var html = folder.File("report.html");

        var result = await Plumb.RunAsync(Root(), Check("--report", "html:" + html, "--format", "jsonl"));

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.StartsWith("<!doctype html>", File.ReadAllText(html), StringComparison.Ordinal);
        Assert.Equal(["run", "claim", "claim", "summary"],
            result.Output.Split('\n', StringSplitOptions.RemoveEmptyEntries).Select(l => JsonDocument.Parse(l).RootElement.GetProperty("record").GetString()));
    }

    [Theory]
    [InlineData("--report", "yaml", "plumb: --report: unknown format 'yaml' in 'yaml' (known: html, json, jsonl, junit, md, text)")]
    [InlineData("--report", "md", "plumb: --report: only one report can go to standard output; give the others a path (FORMAT:PATH)")]
    [InlineData("--junit-fail-on", "overturned,maybe", "plumb: --junit-fail-on: unknown condition 'maybe' (known: overturned, gold, contested, failed, none)")]
    public async Task Run_BadReportOption_ExitsTwoBeforeJudging(string option, string value, string expected)
    {
        var result = await Plumb.RunAsync(Root(), Check("--format", "json", option, value));

        Assert.Equal(2, result.ExitCode);
        Assert.Equal(expected, Assert.Single(result.ErrorLines));
        Assert.Empty(result.Output);
    }

    private sealed class ThrowingWriter : IReportWriter
    {
        public string Format => "broken";

        public Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken) =>
            throw new IOException("the disk is full");
    }

    private sealed class BrokenScorer : IEntailmentScorer
    {
        public string Describe => "broken";

        public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken) =>
            throw new InvalidOperationException("scores out of step");
    }
}
