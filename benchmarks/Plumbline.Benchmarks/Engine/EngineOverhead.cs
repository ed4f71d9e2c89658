using System.Diagnostics;
using System.Globalization;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Solver;

namespace Plumbline.Benchmarks.Engine;

/// <summary>
/// Time the engine itself adds per claim: tree bookkeeping, pair and clause building, and two CP-SAT
/// solves, on the largest tree of the default shape (19 statements, 342 ordered pairs). Model and
/// NLI answer instantly, so their real cost is left out.
/// </summary>
internal static class EngineOverhead
{
    private const int Statements = 19;
    private const int OrderedPairs = Statements * (Statements - 1);
    private const double TargetMedianMs = 20.0;

    public static async Task<int> RunAsync(string[] args, TextWriter output, TextWriter error)
    {
        int runs = 50, warmup = 10, workers = CpSatOptions.Default.Workers;
        for (var i = 0; i < args.Length; i++)
        {
            var value = i + 1 < args.Length && int.TryParse(args[i + 1], NumberStyles.None, CultureInfo.InvariantCulture, out var parsed) && parsed > 0
                ? parsed
                : (int?)null;
            switch (args[i])
            {
                case "--runs" when value is { } n: runs = n; i++; break;
                case "--warmup" when value is { } n: warmup = n; i++; break;
                case "--workers" when value is { } n: workers = n; i++; break;
                default:
                    error.WriteLine($"engine: bad option '{args[i]}' (expected --runs N, --warmup N or --workers N with N > 0)");
                    return 2;
            }
        }

        var solver = new CpSatMaxSatSolver(new CpSatOptions(Workers: workers));
        var engine = new CoherenceEngine(new FullTreeModel(), new HashedScorer(), solver, CoherenceOptions.Default, TimeProvider.System);

        var totals = new List<TimeSpan>(runs);
        var trees = new List<TimeSpan>(runs);
        var clauses = new List<TimeSpan>(runs);
        var solves = new List<TimeSpan>(runs);
        Verdict? last = null;
        for (var run = 0; run < warmup + runs; run++)
        {
            var claim = new Claim($"bench-{run}", $"Claim number {run} holds.");
            var watch = Stopwatch.StartNew();
            var verdict = await engine.JudgeAsync(claim, CancellationToken.None);
            watch.Stop();

            var kept = verdict.Tree?.Kept.Count ?? 0;
            if (verdict.Error is not null || kept != Statements)
            {
                error.WriteLine($"engine: run {run} did not judge a full-size tree ({kept} kept statements): {verdict.Error}");
                return 1;
            }

            if (run >= warmup)
            {
                totals.Add(watch.Elapsed);
                trees.Add(verdict.Timings.Tree);
                clauses.Add(verdict.Timings.Nli);
                solves.Add(verdict.Timings.Solve);
            }

            last = verdict;
        }

        var final = last!;
        var problem = final.Problem!.Problem;

        // The same problem solved alone, one solve at a time: the solver's own share, for comparison.
        var single = new List<TimeSpan>(runs);
        for (var run = 0; run < runs; run++)
        {
            var watch = Stopwatch.StartNew();
            await solver.SolveAsync(problem, CancellationToken.None);
            single.Add(watch.Elapsed);
        }

        var total = Timing.Of(totals);
        output.WriteLine($"engine overhead per claim, full-size tree: {Statements} statements, {OrderedPairs} ordered pairs, "
            + $"{problem.Clauses.Count} clauses, {final.Links.Count} links (last run)");
        output.WriteLine($"model and NLI: instant doubles; solver: {solver.Describe}");
        output.WriteLine($"{runs} runs after {warmup} warm-up runs");
        output.WriteLine($"total  {total}");
        output.WriteLine($"  tree   {Timing.Of(trees)}");
        output.WriteLine($"  pairs and clauses {Timing.Of(clauses)}");
        output.WriteLine($"  two solves, side by side {Timing.Of(solves)}");
        output.WriteLine($"one solve alone {Timing.Of(single)}");
        var met = total.Median <= TargetMedianMs;
        output.WriteLine(FormattableString.Invariant($"target median <= {TargetMedianMs} ms: {(met ? "met" : "NOT met")}"));
        return 0;
    }
}
