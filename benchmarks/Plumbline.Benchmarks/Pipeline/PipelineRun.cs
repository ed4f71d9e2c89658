using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Application.Sinks;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.Runs;
using Plumbline.Models.Recording;
using Plumbline.Nli;
using Plumbline.Reports;
using Plumbline.Solver;

namespace Plumbline.Benchmarks.Pipeline;

/// <summary>
/// The pieces both pipeline benchmarks share: a recording made by running the engine over generated claims with an
/// instant model through a recording tap, and a full run of those claims through the run loop with the recording,
/// the shipped NLI model, CP-SAT and the JSON, HTML and JSON Lines reports written to files.
/// </summary>
internal static class PipelineRun
{
    public static IReadOnlyList<Claim> Claims(int count) =>
        [.. Enumerable.Range(1, count).Select(i => new Claim($"g{i}", $"Appliance model {i} ships with a {2 + i % 4}-year warranty."))];

    /// <summary>Writes the claims as a JSON Lines claim file, which a run then reads as plumb reads one.</summary>
    public static async Task WriteClaimsAsync(string path, IReadOnlyList<Claim> claims)
    {
        await using var writer = new StreamWriter(path, append: false, new System.Text.UTF8Encoding(false)) { NewLine = "\n" };
        foreach (var claim in claims)
        {
            await writer.WriteLineAsync(System.Text.Json.JsonSerializer.Serialize(new Dictionary<string, string> { ["id"] = claim.Id, ["claim"] = claim.Text }));
        }
    }

    /// <summary>Records every request the engine makes for <paramref name="claims"/> with <paramref name="model"/>.</summary>
    public static async Task RecordAsync(string path, ILanguageModel model, IReadOnlyList<Claim> claims, CoherenceOptions options)
    {
        await using var writer = RecordingWriter.Create(path, options.PromptVersion, overwrite: true);
        var engine = new CoherenceEngine(new RecordingTap(model, writer), new InstantScorer(), new CpSatMaxSatSolver(), options, TimeProvider.System);
        foreach (var claim in claims)
        {
            var verdict = await engine.JudgeAsync(claim, CancellationToken.None);
            if (verdict.IsFailed)
            {
                throw new InvalidOperationException($"recording {claim.Id} failed: {verdict.Error}");
            }
        }
    }

    /// <summary>Runs the claim file through the run loop as <c>plumb sweep</c> would (claims streamed from the file),
    /// reports to files in <paramref name="folder"/>.</summary>
    public static async Task<RunOutcome> JudgeAsync(
        string recording, string claimFile, CoherenceOptions options, string folder, int inFlight, int? intraOpThreads = null, int? concurrentRuns = null, string? nliModel = null,
        ResidentTimeline? timeline = null)
    {
        var model = await RecordingLanguageModel.LoadAsync(recording, options.PromptVersion, CancellationToken.None);
        timeline?.Mark("recording indexed");
        var modelOptions = new NliModelOptions { ConcurrentRuns = concurrentRuns };
        modelOptions = intraOpThreads is { } threads ? modelOptions with { IntraOpThreads = threads } : modelOptions;
        using var scorer = OnnxEntailmentScorer.Load(nliModel ?? Path.Combine(AppContext.BaseDirectory, "models", "nli-minilm-int8"), modelOptions: modelOptions);
        timeline?.Mark("NLI model loaded");
        var solver = new CpSatMaxSatSolver(CpSatOptions.Default with { Workers = 1 }, TimeProvider.System);
        var engine = new CoherenceEngine(model, scorer, solver, options, TimeProvider.System);
        var settings = RunSettings.From(options, model.Describe, scorer.Describe, solver.Describe, seed: null);
        var run = new ClaimRun(engine, settings, TimeProvider.System, new RunOptions("benchmark", inFlight));
        // As plumb's composition root does.
        var sinks = new List<IRunSink> { new Cli.Hosting.HeapTrimSink() };
        if (timeline is not null)
        {
            sinks.Add(timeline);
        }

        foreach (var format in new[] { "json", "html", "jsonl" })
        {
            var writer = ReportWriterRegistry.Default.Create(format);
            var destination = ReportDestination.File(Path.Combine(folder, "report." + format));
            sinks.Add(writer is IStreamingReportWriter streaming ? new StreamingReportSink(streaming, destination) : new ReportSink(writer, destination));
            if (timeline is not null)
            {
                sinks.Add(timeline.After(format + " written"));
            }
        }

        using var input = await ClaimInput.OpenFileAsync(claimFile, ClaimFileFormat.JsonLines, CancellationToken.None);
        await using var store = SpillClaimStore.Create(folder);
        var diagnostics = new DiagnosticsSink(Console.Error, debug: true);
        var outcome = await run.RunAsync(input, store, new SinkSet(sinks, diagnostics), gates: null, CancellationToken.None);
        timeline?.Finish();
        return outcome;
    }

    /// <summary>Peak resident set of this process so far, from /proc/self/status (VmHWM), in MiB.</summary>
    public static double PeakResidentMiB()
    {
        foreach (var line in File.ReadLines("/proc/self/status"))
        {
            if (line.StartsWith("VmHWM:", StringComparison.Ordinal))
            {
                var kib = long.Parse(line["VmHWM:".Length..].Trim().Split(' ')[0], System.Globalization.CultureInfo.InvariantCulture);
                return kib / 1024.0;
            }
        }

        throw new InvalidOperationException("no VmHWM line in /proc/self/status");
    }

    /// <summary>Scores instantly (neutral); used only while recording, where the NLI model plays no part.</summary>
    private sealed class InstantScorer : Core.Entailment.IEntailmentScorer
    {
        public string Describe => "instant";

        public Task<IReadOnlyList<Core.Entailment.EntailmentScores>> ScoreAsync(IReadOnlyList<Core.Entailment.SentencePair> pairs, CancellationToken cancellationToken) =>
            Task.FromResult<IReadOnlyList<Core.Entailment.EntailmentScores>>([.. pairs.Select(_ => new Core.Entailment.EntailmentScores(0.1, 0.8, 0.1))]);
    }
}
