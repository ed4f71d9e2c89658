using System.Diagnostics;
using System.Globalization;
using System.IO.Compression;
using System.Security.Cryptography;
using System.Text.Json;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.Core.Trees;
using Plumbline.Models.Recording;
using Plumbline.Nli;
using Plumbline.Solver;

namespace Plumbline.Benchmarks.Trees;

/// <summary>
/// The whole engine over recorded explanation trees with gold labels (a claim file and a recording in one
/// folder), with a given NLI model: direct and coherent accuracy with Wilson intervals, overturns and the
/// share of them that were right, for the engine's defaults or for a grid of settings, and two link-health
/// shares of the NLI model on tree pairs. NLI scores are kept per model in a cache folder, so a grid reruns
/// without the model and a new model costs one scoring pass.
/// </summary>
internal static class TreeGridBenchmark
{
    private const string Usage =
        "trees --trees DIR [--nli-model DIR] [--against DIR] [--cache DIR] [--grid defaults|full] [--workers N] [--limit N] [--check-solver]";

    public static async Task<int> RunAsync(string[] args, TextWriter output, TextWriter error)
    {
        string? trees = null, nliModel = null, cacheFolder = null, against = null;
        var grid = "defaults";
        int workers = 2, limit = int.MaxValue;
        var checkSolver = false;
        for (var i = 0; i < args.Length; i++)
        {
            var next = i + 1 < args.Length ? args[i + 1] : null;
            int? count = next is not null && int.TryParse(next, NumberStyles.None, CultureInfo.InvariantCulture, out var parsed) && parsed > 0 ? parsed : null;
            switch (args[i])
            {
                case "--trees" when next is not null: trees = next; i++; break;
                case "--nli-model" when next is not null: nliModel = next; i++; break;
                case "--against" when next is not null: against = next; i++; break;
                case "--cache" when next is not null: cacheFolder = next; i++; break;
                case "--grid" when next is "defaults" or "full": grid = next; i++; break;
                case "--workers" when count is { } n: workers = n; i++; break;
                case "--limit" when count is { } n: limit = n; i++; break;
                case "--check-solver": checkSolver = true; break;
                default:
                    error.WriteLine($"trees: bad option '{args[i]}'; usage: {Usage}");
                    return 2;
            }
        }

        if (trees is null)
        {
            error.WriteLine($"trees: --trees DIR is required (a folder with claims.jsonl and recording.jsonl[.gz]); usage: {Usage}");
            return 2;
        }

        nliModel ??= RepositoryPaths.ShippedNliModel();
        cacheFolder ??= Path.Combine(RepositoryPaths.Root(), "artifacts", "trees-cache");
        try
        {
            var claims = ReadClaims(Path.Combine(trees, "claims.jsonl")).Take(limit).ToList();
            var recording = await OpenRecordingAsync(trees, cacheFolder);
            using var model = NliModel.Load(nliModel);
            var cache = ScoreCache.Open(cacheFolder, model.ModelSha256, model.Card.Temperature);
            output.WriteLine($"trees: {claims.Count} claims from {trees}");
            output.WriteLine($"NLI model: {model.Describe}; model.onnx sha256 {model.ModelSha256}");
            output.WriteLine($"score cache: {cache.Path} ({cache.Count} pairs)");

            var defaults = CoherenceOptions.Default;
            var cells = grid == "full"
                ? [.. GridCell.Variations(defaults), .. GridCell.Full()]
                : GridCell.Variations(defaults);
            // Link health reads every statement by its own text under the default tree rules.
            var health = new GridCell(defaults with { NliText = NliText.Statement });
            var planned = cells.Append(health).GroupBy(c => c.PairShape).Select(g => g.First()).ToList();

            await FillCacheAsync(claims, recording, model, cache, planned, workers, output, error);

            var solver = new ExactSmallSolver();
            var scorer = new CachedScorer(cache, model.Describe, planning: false);
            output.WriteLine();
            output.WriteLine($"{"",2} {GridCell.Header} | {"direct",-6} {"paired",-6} {"coherent  [Wilson 95%]",-23} {"gain",6} | {"overturned",-10} {"right",-11} | {"contested",9} {"norm. margin",12} {"calls",5} | other settings");
            var results = new List<(GridCell Cell, CellFigures Figures, bool[] Right)>();
            IReadOnlyList<Verdict>? healthVerdicts = null;
            foreach (var cell in cells.Append(health).Distinct())
            {
                var watch = Stopwatch.StartNew();
                var verdicts = await JudgeAllAsync(claims, new CoherenceEngine(recording, scorer, solver, cell.Options, TimeProvider.System), workers);
                var figures = CellFigures.Of(verdicts);
                if (cell == health)
                {
                    healthVerdicts = verdicts;
                }

                if (!cells.Contains(cell))
                {
                    continue;
                }

                results.Add((cell, figures, [.. verdicts.Select(v => v.Answer == v.Claim.Gold)]));
                var mark = cell.Options == defaults ? "*" : "";
                output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"{mark,2} {cell.Columns} | {Percent(figures.Direct),-6} {Percent(figures.PairedDirect),-6} {Percent(figures.Coherent)} [{Percent(figures.Coherent.Low)}-{Percent(figures.Coherent.High)}]{"",4} {figures.GainPoints,6:+0.0;-0.0;0.0} | {figures.Overturned,4} {Share(figures.Overturned, figures.Claims),-5} {figures.OverturnedRight,4} {Share(figures.OverturnedRight, figures.Overturned),-6} | {figures.Contested,9} {figures.MeanNormalisedMargin,12:0.0000} {figures.CallsPerClaim,5:0.0} | {cell.Extras} ({watch.Elapsed.TotalSeconds:0.0} s{(figures.Failed > 0 ? $", {figures.Failed} failed" : "")})"));
            }

            PrintSummary(output, results, defaults);
            var links = LinkHealth.Of(healthVerdicts!);
            output.WriteLine();
            output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"link health (default tree rules, integrity gap {defaults.IntegrityGap:0.##}, own texts, most likely label):"));
            output.WriteLine($"  same-answer first-level explanation pairs linked as contradiction: {Share(links.SameAnswerContradictions, links.SameAnswerLinks)} ({links.SameAnswerContradictions} of {links.SameAnswerLinks} non-neutral links)");
            output.WriteLine($"  claim-explanation links against the answer the explanation was written for: {Share(links.ClaimLinksAgainst, links.ClaimLinks)} ({links.ClaimLinksAgainst} of {links.ClaimLinks})");

            if (against is not null)
            {
                // Another NLI model (say, the shipped one against a candidate) with the same defaults, claim by claim.
                using var other = NliModel.Load(against);
                var otherCache = ScoreCache.Open(cacheFolder, other.ModelSha256, other.Card.Temperature);
                await FillCacheAsync(claims, recording, other, otherCache, [new GridCell(defaults)], workers, output, error);
                var otherVerdicts = await JudgeAllAsync(claims, new CoherenceEngine(recording, new CachedScorer(otherCache, other.Describe, planning: false), solver, defaults, TimeProvider.System), workers);
                var otherRight = otherVerdicts.Select(v => v.Answer == v.Claim.Gold).ToArray();
                var thisRight = results.Single(r => r.Cell.Options == defaults).Right;
                var (onlyThis, onlyOther) = (Discordant(thisRight, otherRight), Discordant(otherRight, thisRight));
                output.WriteLine();
                output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"against {other.Describe} with the defaults: coherent {Percent(CellFigures.Of(otherVerdicts).Coherent)}; {onlyThis} claims right only with this model, {onlyOther} only with that one, McNemar p = {McNemar(onlyThis, onlyOther):0.000}"));
            }

            if (checkSolver)
            {
                await CheckSolverAsync(claims, recording, scorer, defaults, output);
            }

            return 0;
        }
        catch (Exception e) when (e is IOException or NliModelException or RecordingFormatException or JsonException or InvalidDataException)
        {
            error.WriteLine($"trees: {e.Message}");
            return 2;
        }
    }

    /// <summary>Judges every claim, <paramref name="workers"/> at a time, keeping the claim order.</summary>
    private static async Task<Verdict[]> JudgeAllAsync(IReadOnlyList<Claim> claims, CoherenceEngine engine, int workers)
    {
        var verdicts = new Verdict[claims.Count];
        await Parallel.ForEachAsync(
            Enumerable.Range(0, claims.Count),
            new ParallelOptions { MaxDegreeOfParallelism = workers },
            async (i, token) => verdicts[i] = await engine.JudgeAsync(claims[i], token));
        return verdicts;
    }

    /// <summary>
    /// Runs the engine once per distinct pair shape with a scorer that notes unscored pairs, then scores
    /// those with the ONNX model in chunks, appending each chunk to the cache as it finishes.
    /// </summary>
    private static async Task FillCacheAsync(
        IReadOnlyList<Claim> claims,
        ILanguageModel recording,
        NliModel model,
        ScoreCache cache,
        IReadOnlyList<GridCell> planned,
        int workers,
        TextWriter output,
        TextWriter error)
    {
        var planner = new CachedScorer(cache, model.Describe, planning: true);
        foreach (var cell in planned)
        {
            await JudgeAllAsync(claims, new CoherenceEngine(recording, planner, new ExactSmallSolver(), cell.Options, TimeProvider.System), workers);
        }

        var missing = planner.Missing.Keys.ToList();
        output.WriteLine($"pairs to score: {missing.Count} (the rest are cached)");
        if (missing.Count == 0)
        {
            return;
        }

        using var scorer = new OnnxEntailmentScorer(model, new NliScorerOptions { Cache = false });
        const int Chunk = 1024;
        var watch = Stopwatch.StartNew();
        for (var start = 0; start < missing.Count; start += Chunk)
        {
            var chunk = missing.GetRange(start, Math.Min(Chunk, missing.Count - start));
            var scores = await scorer.ScoreAsync(chunk, CancellationToken.None);
            cache.Add(chunk, scores);
            var done = start + chunk.Count;
            var rate = done / watch.Elapsed.TotalSeconds;
            error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"trees: scored {done} of {missing.Count} pairs, {rate:0} pairs/s, about {(missing.Count - done) / rate / 60:0.0} min left"));
        }

        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"scored {missing.Count} pairs in {watch.Elapsed.TotalMinutes:0.0} min ({missing.Count / watch.Elapsed.TotalSeconds:0} pairs/s)"));
    }

    /// <summary>Least gain, in points of mean coherent accuracy over the grid, for the rule to move a setting away from the plain method.</summary>
    internal const double RuleMinimumGainPoints = 0.2;

    /// <summary>Largest McNemar p at which the rule's cell replaces the plain method's settings.</summary>
    internal const double RuleMaximumP = 0.05;

    /// <summary>
    /// Per setting, the mean coherent accuracy over the full grid's cells that use it; the best cell; and the
    /// cell the documented rule picks: each setting moves away from the plain method's
    /// (<see cref="GridCell.PlainMethod"/>) only to the level with the highest mean, and only when that mean is
    /// at least <see cref="RuleMinimumGainPoints"/> above the plain level's; the picked cell is adopted when it
    /// beats the plain method's cell claim by claim with McNemar p below <see cref="RuleMaximumP"/>.
    /// </summary>
    private static void PrintSummary(TextWriter output, List<(GridCell Cell, CellFigures Figures, bool[] Right)> results, CoherenceOptions defaults)
    {
        var full = results.Where(r => r.Cell.Extras.Length == 0).ToList();
        if (full.Count <= 1)
        {
            return;
        }

        output.WriteLine();
        output.WriteLine($"mean coherent accuracy per setting over the {full.Count} cells that vary only the seven grid settings (rule: move from the plain method's level only for a gain of {RuleMinimumGainPoints} points or more):");
        var plain = GridCell.PlainMethod;
        var picked = new Dictionary<string, string>();
        foreach (var (name, level) in GridCell.Dimensions)
        {
            var means = full.GroupBy(r => level(r.Cell.Options)).ToDictionary(g => g.Key, g => 100 * g.Average(r => r.Figures.Coherent.Value));
            var plainLevel = level(plain);
            var best = means.MaxBy(m => m.Value);
            picked[name] = best.Value - means[plainLevel] >= RuleMinimumGainPoints ? best.Key : plainLevel;
            var levels = means.Select(m => string.Create(CultureInfo.InvariantCulture, $"{m.Key}: {m.Value:0.00}%"));
            output.WriteLine($"  {name,-18} {string.Join(" | ", levels)}  -> {picked[name]}");
        }

        var bestCell = full.MaxBy(r => r.Figures.Coherent.Value);
        var plainCell = full.First(r => GridCell.Dimensions.All(d => d.Level(r.Cell.Options) == d.Level(plain)));
        var ruleCell = full.First(r => GridCell.Dimensions.All(d => d.Level(r.Cell.Options) == picked[d.Name]));
        var defaultsCell = results.First(r => r.Cell.Options == defaults);
        Compare(output, "best cell", bestCell, plainCell);
        Compare(output, "the rule's cell", ruleCell, plainCell);
        Compare(output, "the defaults", defaultsCell, plainCell);
        var adopt = McNemar(Discordant(ruleCell.Right, plainCell.Right), Discordant(plainCell.Right, ruleCell.Right)) < RuleMaximumP;
        output.WriteLine($"rule's verdict: {(adopt ? "adopt the rule's cell" : "keep the plain method's settings")}: {(adopt ? ruleCell : plainCell).Cell.Columns.TrimEnd()}");
    }

    private static void Compare(TextWriter output, string name, (GridCell Cell, CellFigures Figures, bool[] Right) cell, (GridCell Cell, CellFigures Figures, bool[] Right) plain)
    {
        var (onlyThis, onlyPlain) = (Discordant(cell.Right, plain.Right), Discordant(plain.Right, cell.Right));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"{name + ":",-16} {cell.Cell.Columns.TrimEnd()}  coherent {Percent(cell.Figures.Coherent)} [{Percent(cell.Figures.Coherent.Low)}-{Percent(cell.Figures.Coherent.High)}], gain {cell.Figures.GainPoints:+0.0;-0.0;0.0} points; against the plain method {onlyThis} claims right only here, {onlyPlain} only there, McNemar p = {McNemar(onlyThis, onlyPlain):0.000}"));
    }

    /// <summary>Claims <paramref name="first"/> gets right and <paramref name="second"/> does not.</summary>
    private static int Discordant(bool[] first, bool[] second) => first.Zip(second).Count(p => p.First && !p.Second);

    /// <summary>
    /// Two-sided p of McNemar's test with continuity correction (common practice) for b and c discordant pairs:
    /// z = (|b - c| - 1) / sqrt(b + c) against the standard normal.
    /// </summary>
    internal static double McNemar(int b, int c)
    {
        if (b + c == 0)
        {
            return 1.0;
        }

        var z = Math.Max(0, Math.Abs(b - c) - 1) / Math.Sqrt(b + c);
        return Math.Min(1.0, 2 * (1 - StandardNormal(z)));
    }

    /// <summary>Φ(z) through the error function approximation 7.1.26 of Abramowitz and Stegun (absolute error below 1.5e-7).</summary>
    private static double StandardNormal(double z)
    {
        var x = Math.Abs(z) / Math.Sqrt(2);
        var t = 1 / (1 + 0.3275911 * x);
        var erf = 1 - (((((1.061405429 * t - 1.453152027) * t) + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.Exp(-x * x);
        return z >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
    }

    /// <summary>Solves every default-settings problem with CP-SAT too and counts the optima that agree.</summary>
    private static async Task CheckSolverAsync(IReadOnlyList<Claim> claims, ILanguageModel recording, IEntailmentScorer scorer, CoherenceOptions options, TextWriter output)
    {
        var exact = await JudgeAllAsync(claims, new CoherenceEngine(recording, scorer, new ExactSmallSolver(), options, TimeProvider.System), 2);
        var cpSat = await JudgeAllAsync(claims, new CoherenceEngine(recording, scorer, new CpSatMaxSatSolver(CpSatOptions.Default with { Workers = 1 }, TimeProvider.System), options, TimeProvider.System), 2);
        var same = exact.Zip(cpSat).Count(p => p.First.ObjectiveCost == p.Second.ObjectiveCost && p.First.Margin == p.Second.Margin && p.First.Answer == p.Second.Answer);
        output.WriteLine();
        output.WriteLine($"solver check: the benchmark's exact search and CP-SAT agree on optimum cost, margin and answer for {same} of {claims.Count} claims");
    }

    private static IEnumerable<Claim> ReadClaims(string path)
    {
        var line = 0;
        foreach (var text in File.ReadLines(path))
        {
            line++;
            if (string.IsNullOrWhiteSpace(text))
            {
                continue;
            }

            using var json = JsonDocument.Parse(text);
            var root = json.RootElement;
            var gold = root.TryGetProperty("gold", out var g) && g.ValueKind is JsonValueKind.True or JsonValueKind.False ? g.GetBoolean() : (bool?)null;
            yield return new Claim(
                root.GetProperty("id").GetString() ?? throw new InvalidDataException($"{path}:{line}: id: missing"),
                root.GetProperty("claim").GetString() ?? throw new InvalidDataException($"{path}:{line}: claim: missing"),
                gold ?? throw new InvalidDataException($"{path}:{line}: gold: expected true or false"));
        }
    }

    /// <summary>The folder's recording; a gzip file is unpacked once into the cache folder, named by its hash.</summary>
    private static async Task<RecordingLanguageModel> OpenRecordingAsync(string folder, string cacheFolder)
    {
        var plain = Path.Combine(folder, "recording.jsonl");
        if (!File.Exists(plain))
        {
            var packed = Path.Combine(folder, "recording.jsonl.gz");
            var hash = Convert.ToHexStringLower(SHA256.HashData(await File.ReadAllBytesAsync(packed)))[..16];
            Directory.CreateDirectory(cacheFolder);
            plain = Path.Combine(cacheFolder, $"recording-{hash}.jsonl");
            if (!File.Exists(plain))
            {
                await using var input = new GZipStream(File.OpenRead(packed), CompressionMode.Decompress);
                await using var unpacked = File.Create(plain + ".part");
                await input.CopyToAsync(unpacked);
                unpacked.Close();
                File.Move(plain + ".part", plain);
            }
        }

        return await RecordingLanguageModel.LoadAsync(plain, PromptBook.PromptVersion, CancellationToken.None);
    }

    private static string Percent(Proportion p) => Percent(p.Value);

    private static string Percent(double share) => (100 * share).ToString("0.0", CultureInfo.InvariantCulture) + "%";

    private static string Share(int part, int whole) => whole == 0 ? "-" : Percent((double)part / whole);
}
