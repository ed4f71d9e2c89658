using System.Diagnostics;
using System.Globalization;
using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Application.Sinks;
using Plumbline.Benchmarks.Engine;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;
using Plumbline.Core.Runs;
using Plumbline.LoopbackEndpoint;
using Plumbline.Models.Http;
using Plumbline.Models.Limits;
using Plumbline.Solver;

namespace Plumbline.Benchmarks.Live;

/// <summary>
/// How well a run keeps a slow endpoint busy. A loopback OpenAI-compatible server answers every request
/// after a fixed delay L, with full-size trees (the claim's six explanations fail the integrity test, so
/// each is expanded once more: 19 statements). The model goes through the real HTTP backend and the
/// global call cap; NLI is an instant hashed double and the solver is CP-SAT, so the figures measure the
/// scheduling of model calls, not NLI speed. Printed:
/// <list type="bullet">
/// <item>one claim: wall time / (dependent rounds x L), the rounds counted from the engine's order of
/// requests (per level: abductions, then negations, then answer probabilities; the root has no abduction);</item>
/// <item>N claims through the run loop with a cap of K calls: wall time / (total calls / K x L);</item>
/// <item>calls and tokens per claim.</item>
/// </list>
/// No response cache: every call goes to the server.
/// </summary>
internal static class LatencyBenchmark
{
    public static async Task<int> RunAsync(string[] args, TextWriter output, TextWriter error)
    {
        var delayMs = Option(args, "--delay-ms", 100);
        var claims = Option(args, "--claims", 100);
        var cap = Option(args, "--cap", 16);
        var inFlight = Option(args, "--in-flight", 16);
        if (delayMs < 1 || claims < 1 || cap < 1 || inFlight < 1)
        {
            await error.WriteLineAsync("latency: --delay-ms, --claims, --cap and --in-flight take whole numbers of 1 or more");
            return 2;
        }

        var delay = TimeSpan.FromMilliseconds(delayMs);
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(Delay: delay) { Answers = new ScriptedAnswers { FlatDepthOne = true } });
        var shape = CoherenceOptions.Default.Shape;
        // Per level the engine waits for its abductions, then the negations, then the answer probabilities.
        var rounds = 2 + 3 * shape.MaxDepth;
        await output.WriteLineAsync(Invariant($"latency: loopback endpoint answering after L = {delayMs} ms; HTTP backend, CP-SAT, instant hashed NLI; {Environment.ProcessorCount} cores"));

        // One claim at a time, with room for every call of a level at once, after warm-up claims (code,
        // connections and solver warm, as every claim but a run's first finds them); five claims, median.
        var singles = new List<TimeSpan>();
        var singleCalls = 0;
        await using (var parts = await PartsAsync(server, cap: 64))
        {
            for (var i = 0; i < 5; i++)
            {
                var clock = Stopwatch.StartNew();
                var verdict = await parts.Engine.JudgeAsync(new Claim(Invariant($"one{i}"), Invariant($"Invented single claim {i} holds.")), CancellationToken.None);
                singles.Add(clock.Elapsed);
                singleCalls = verdict.ModelCalls;
            }
        }

        var single = Timing.Of(singles);
        var ideal1 = rounds * delay.TotalMilliseconds;
        await output.WriteLineAsync(Invariant($"  one claim: median {single.Median / 1000:0.000} s (min {single.Min / 1000:0.000}, max {single.Max / 1000:0.000}, 5 claims) for {rounds} dependent rounds x {delayMs} ms = {ideal1 / 1000:0.000} s; ratio {single.Median / ideal1:0.00} (min {single.Min / ideal1:0.00}; target <= 1.3)"));

        // Many claims through the run loop, all calls under one cap.
        var many = await JudgeAsync(
            server,
            [.. Enumerable.Range(1, claims).Select(i => new Claim(Invariant($"c{i}"), Invariant($"Invented claim number {i} holds.")))],
            cap,
            inFlight);
        var figures = many.Report.Figures;
        var ideal = figures.ModelCalls / (double)cap * delay.TotalSeconds;
        var manyRatio = many.Wall.TotalSeconds / ideal;
        await output.WriteLineAsync(Invariant($"  {claims} claims, cap K = {cap} calls, {inFlight} claims in flight: {many.Wall.TotalSeconds:0.000} s for {figures.ModelCalls} calls / {cap} x {delayMs} ms = {ideal:0.000} s; ratio {manyRatio:0.00} (target <= 1.3)"));
        await output.WriteLineAsync(Invariant($"  calls per claim {figures.ModelCalls / (double)claims:0.0} (one claim alone: {singleCalls}); tokens per claim {figures.Tokens.Total / (double)claims:0.0} ({figures.Tokens.PromptTokens / (double)claims:0.0} prompt, {figures.Tokens.CompletionTokens / (double)claims:0.0} completion, as the loopback server counts them: prompt characters / 4)"));
        await output.WriteLineAsync(Invariant($"  judged {figures.Judged} of {claims}, failed {figures.Failed}"));
        return figures.Failed == 0 ? 0 : 1;
    }

    private static async Task<(Plumbline.Reports.Model.RunReport Report, TimeSpan Wall)> JudgeAsync(
        LoopbackModelServer server, IReadOnlyList<Claim> claims, int cap, int inFlight)
    {
        await using var parts = await PartsAsync(server, cap);
        var settings = RunSettings.From(CoherenceOptions.Default, parts.Model.Describe, "instant hashed NLI", "CP-SAT", seed: null);
        var run = new ClaimRun(parts.Engine, settings, TimeProvider.System, new RunOptions("benchmark", inFlight));
        using var input = ClaimInput.FromClaims("benchmark", claims);
        await using var store = new MemoryClaimStore();
        var diagnostics = new DiagnosticsSink(TextWriter.Null, debug: false);
        var clock = Stopwatch.StartNew();
        var outcome = await run.RunAsync(input, store, new SinkSet([diagnostics], diagnostics), gates: null, CancellationToken.None);
        return (outcome.Report, clock.Elapsed);
    }

    /// <summary>The HTTP backend under a call cap, and an engine over it, warmed up by a few claims.</summary>
    private static async Task<Parts> PartsAsync(LoopbackModelServer server, int cap)
    {
        var kind = new HttpSourceKind(
            new HttpModelOptions("loopback", Resilience: CallResilienceOptions.Default with { AttemptTimeout = TimeSpan.FromSeconds(30) }),
            _ => null,
            TimeProvider.System);
        var opened = await kind.OpenAsync(server.BaseUrl.ToString(), new ModelOpening(PromptBook.PromptVersion), CancellationToken.None);
        var model = new CappedLanguageModel(opened.Model, cap);
        var solver = new CpSatMaxSatSolver(CpSatOptions.Default with { Workers = 1 }, TimeProvider.System);
        var engine = new CoherenceEngine(model, new HashedScorer(), solver, CoherenceOptions.Default, TimeProvider.System);
        await Task.WhenAll(Enumerable.Range(0, Math.Min(cap, 4)).Select(i =>
            engine.JudgeAsync(new Claim("warm-up", Invariant($"Warm-up claim {i} for a cap of {cap} holds.")), CancellationToken.None)));
        return new Parts(model, engine);
    }

    private sealed record Parts(ILanguageModel Model, CoherenceEngine Engine) : IAsyncDisposable
    {
        public ValueTask DisposeAsync() => Model.DisposeAsync();
    }

    private static int Option(string[] args, string name, int fallback)
    {
        var at = Array.IndexOf(args, name);
        return at >= 0 && at + 1 < args.Length && int.TryParse(args[at + 1], NumberStyles.Integer, CultureInfo.InvariantCulture, out var value) ? value : fallback;
    }

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
