using System.Diagnostics;
using System.Globalization;
using Plumbline.Benchmarks.Engine;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.Trees;

namespace Plumbline.Benchmarks.Pipeline;

/// <summary>
/// <c>pipeline-memory</c>: peak resident memory of whole runs of 1,000 and 10,000 generated claims (recorded answers,
/// the shipped NLI model, CP-SAT, JSON, HTML and JSON Lines reports), each in a process of its own, side by side.
/// <c>pipeline-throughput</c>: claims per minute on full-size trees (19 statements) with recorded answers and the
/// shipped NLI model, and where the time of a claim goes (NLI scoring, solving, the rest).
/// </summary>
internal static class PipelineBenchmarks
{
    /// <summary>Small trees keep 10,000 claims within a benchmark's time; memory, not speed, is measured here.</summary>
    private static readonly CoherenceOptions SmallTrees = CoherenceOptions.Default with
    {
        Shape = new TreeShape([new LevelShape(1, Decoding.Greedy())]),
        Negation = NegationMode.Prefix,
    };

    public static async Task<int> MemoryAsync(string[] args, TextWriter output, TextWriter error)
    {
        if (args is ["--child", var countText, var recordingPath, var claimFile, var folderPath])
        {
            // As plumb's own start does, so that the figures are plumb's.
            Cli.Hosting.NativeHeap.LimitArenas();
            var count = int.Parse(countText, CultureInfo.InvariantCulture);
            var watch = Stopwatch.StartNew();
            var outcome = await PipelineRun.JudgeAsync(recordingPath, claimFile, SmallTrees, folderPath, inFlight: 4, timeline: new ResidentTimeline(output));
            var peak = PipelineRun.PeakResidentMiB();
            var committed = GC.GetGCMemoryInfo().TotalCommittedBytes / 1048576.0;
            var live = GC.GetTotalMemory(forceFullCollection: true) / 1048576.0;
            output.WriteLine(FormattableString.Invariant(
                $"{count}\t{peak:0.0}\t{live:0.0}\t{committed:0.0}\t{watch.Elapsed.TotalSeconds:0.0}\t{outcome.Report.Figures.Judged}\t{new FileInfo(Path.Combine(folderPath, "report.html")).Length / 1048576.0:0.0}"));
            return outcome.Report.Figures.Judged == count ? 0 : 1;
        }

        var sizes = args is ["--claims", var a, var b] ? new[] { int.Parse(a, CultureInfo.InvariantCulture), int.Parse(b, CultureInfo.InvariantCulture) } : [1_000, 10_000];
        output.WriteLine("pipeline-memory: whole runs in separate processes (recorded answers, shipped NLI model, CP-SAT, json + html + jsonl reports)");
        output.WriteLine("claims\tpeak RSS MiB\tlive managed MiB (after a full GC at the end)\tmanaged committed MiB at the end\twall s\tjudged\thtml MiB");
        var peaks = new List<double>();
        var timelines = new List<string>();
        foreach (var size in sizes)
        {
            // The recording is made here, so that the child process holds only what a run of plumb holds.
            using var folder = new Scratch();
            var recording = Path.Combine(folder.Path, "recording.jsonl");
            var claims = Path.Combine(folder.Path, "claims.jsonl");
            await PipelineRun.RecordAsync(recording, new SmallTreeModel(), PipelineRun.Claims(size), SmallTrees);
            await PipelineRun.WriteClaimsAsync(claims, PipelineRun.Claims(size));
            var lines = await ChildAsync(["pipeline-memory", "--child", size.ToString(CultureInfo.InvariantCulture), recording, claims, folder.Path], error);
            if (lines is null)
            {
                return 1;
            }

            var line = lines[^1];
            output.WriteLine(line);
            timelines.AddRange(lines[..^1].Select(mark => $"  {size} claims, {mark}"));
            peaks.Add(double.Parse(line.Split('\t')[1], CultureInfo.InvariantCulture));
        }

        foreach (var timeline in timelines)
        {
            output.WriteLine(timeline);
        }

        var ratio = peaks[1] / peaks[0];
        output.WriteLine(FormattableString.Invariant(
            $"peak RSS {sizes[1]} / {sizes[0]} claims: {ratio:0.000} (target: both <= 500 MiB and within 10%: {(peaks.All(p => p <= 500) && Math.Abs(ratio - 1) <= 0.10 ? "met" : "NOT met")})"));
        return 0;
    }

    /// <summary>
    /// The default settings, but keeping explanations without a final full stop: the generated full-size trees write
    /// "statement | for k", which the default rule would discard as cut off, leaving a tree of one statement.
    /// </summary>
    private static readonly CoherenceOptions FullTrees = CoherenceOptions.Default with { DiscardCutOff = false };

    public static async Task<int> ThroughputAsync(string[] args, TextWriter output, TextWriter error)
    {
        var count = Named(args, "--claims") ?? 24;
        var inFlight = Named(args, "--in-flight") ?? Application.Running.RunOptions.DefaultInFlight;
        var intraOp = Named(args, "--intra-op");
        var concurrentRuns = Named(args, "--concurrent-runs");
        // Another NLI model folder, to compare two models' throughput side by side in one sitting.
        var nliModel = Text(args, "--nli-model");
        using var folder = new Scratch();
        var claims = PipelineRun.Claims(count);
        var recording = Path.Combine(folder.Path, "recording.jsonl");
        await PipelineRun.RecordAsync(recording, new FullTreeModel(), claims, FullTrees);

        var claimFile = Path.Combine(folder.Path, "claims.jsonl");
        await PipelineRun.WriteClaimsAsync(claimFile, claims);
        var watch = Stopwatch.StartNew();
        var outcome = await PipelineRun.JudgeAsync(recording, claimFile, FullTrees, folder.Path, inFlight, intraOp, concurrentRuns, nliModel);
        var wall = watch.Elapsed;

        // Per-claim timings from the JSON report: tree (model calls), NLI scoring, solving.
        using var report = System.Text.Json.JsonDocument.Parse(await File.ReadAllTextAsync(Path.Combine(folder.Path, "report.json")));
        double tree = 0, nli = 0, solve = 0;
        var statements = new List<int>();
        foreach (var claim in report.RootElement.GetProperty("claims").EnumerateArray())
        {
            var timings = claim.GetProperty("timings_ms");
            tree += timings.GetProperty("tree").GetDouble();
            nli += timings.GetProperty("nli").GetDouble();
            solve += timings.GetProperty("solve").GetDouble();
            statements.Add(claim.GetProperty("counts").GetProperty("kept").GetInt32());
        }

        var judged = outcome.Report.Figures.Judged;
        var busy = wall.TotalMilliseconds * Math.Min(inFlight, Environment.ProcessorCount);
        output.WriteLine(FormattableString.Invariant($"pipeline-throughput: {judged} claims, kept statements per claim {statements.Min()}-{statements.Max()}, {inFlight} in flight, {Environment.ProcessorCount} cores, {intraOp ?? new Nli.NliModelOptions().IntraOpThreads} intra-op threads per batch, {concurrentRuns?.ToString(CultureInfo.InvariantCulture) ?? "default"} batches at once, NLI model {nliModel ?? "shipped"}"));
        output.WriteLine(FormattableString.Invariant($"wall {wall.TotalSeconds:0.0} s, {judged / wall.TotalMinutes:0.0} claims/min (target 60: {(judged / wall.TotalMinutes >= 60 ? "met" : "NOT met")})"));
        var claimTime = tree + nli + solve;
        output.WriteLine(FormattableString.Invariant(
            $"share of claim time: NLI {nli / claimTime:P1}, solving {solve / claimTime:P1}, the rest (tree from recorded answers, clauses) {tree / claimTime:P1}"));
        output.WriteLine(FormattableString.Invariant(
            $"claim time summed over claims {claimTime / 1000:0.0} s against wall x min(in flight, cores) {busy / 1000:0.0} s: {Math.Max(0, 1 - claimTime / busy):P1} of that outside the engine (run loop, reports, waiting)"));
        return judged == count ? 0 : 1;
    }

    private static int? Named(string[] args, string name) =>
        Text(args, name) is { } value ? int.Parse(value, CultureInfo.InvariantCulture) : null;

    private static string? Text(string[] args, string name)
    {
        var at = Array.IndexOf(args, name);
        return at >= 0 && at + 1 < args.Length ? args[at + 1] : null;
    }

    /// <summary>The child's output lines (the figures last), or null when it failed.</summary>
    private static async Task<string[]?> ChildAsync(string[] args, TextWriter error)
    {
        var host = Environment.ProcessPath ?? "dotnet";
        var start = new ProcessStartInfo(host) { RedirectStandardOutput = true, UseShellExecute = false };
        if (Path.GetFileNameWithoutExtension(host) == "dotnet")
        {
            start.ArgumentList.Add(typeof(PipelineBenchmarks).Assembly.Location);
        }

        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        using var child = Process.Start(start)!;
        var text = await child.StandardOutput.ReadToEndAsync();
        await child.WaitForExitAsync();
        if (child.ExitCode != 0)
        {
            await error.WriteLineAsync($"pipeline-memory: the run of {args[2]} claims failed (exit {child.ExitCode})");
            return null;
        }

        return text.Trim().Split('\n');
    }

    /// <summary>A temporary folder for the recording, the spill file and the reports.</summary>
    private sealed class Scratch : IDisposable
    {
        public string Path { get; } = Directory.CreateTempSubdirectory("plumb-bench-").FullName;

        public void Dispose() => Directory.Delete(Path, recursive: true);
    }
}
