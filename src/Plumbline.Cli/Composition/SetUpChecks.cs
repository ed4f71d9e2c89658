using System.Diagnostics;
using System.Globalization;
using Plumbline.Cli.Options;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;
using Plumbline.Core.MaxSat;
using Plumbline.LocalModel;
using Plumbline.Models.Cache;

namespace Plumbline.Cli.Composition;

/// <summary>
/// The checks of <c>plumb doctor</c>, each on the real part a run would use, each independent of the others: the NLI
/// model loads and reads two known pairs as it should, the MAX-SAT solver proves the optimum of a small known
/// instance, the response cache opens, and (when a model source is configured) the source opens and answers one
/// cheap request. A failed check says what to fix.
/// </summary>
internal sealed class SetUpChecks(CompositionRoot root)
{
    /// <summary>Pairs every three-way NLI model should read one way; the shipped model gives 0.94 contradiction and 0.75 entailment.</summary>
    internal static readonly (SentencePair Pair, EntailmentKind Expected)[] KnownPairs =
    [
        (new SentencePair("A man is sleeping in his bed.", "A man is awake and running outside."), EntailmentKind.Contradiction),
        (new SentencePair("A dog is running through a field.", "An animal is outside."), EntailmentKind.Entailment),
    ];

    /// <summary>
    /// A small instance with a known optimum, worked out by hand: hard (x1 or x2), soft (not x1) weight 3, (not x2)
    /// weight 2, (x1) weight 2. x1 alone costs 3, x2 alone 2 + 2 = 4, both 3 + 2 = 5: the optimum is 3, x1 true, x2 false.
    /// </summary>
    internal static readonly MaxSatProblem KnownInstance = new(2,
    [
        WeightedClause.Hard(1, 2),
        WeightedClause.Soft(3, -1),
        WeightedClause.Soft(2, -2),
        WeightedClause.Soft(2, 1),
    ]);

    /// <summary>The statement of the model check: short, so the call is cheap.</summary>
    internal const string ProbeStatement = "Water is wet.";

    public async Task<IReadOnlyList<SetUpCheck>> RunAsync(ModelSettings model, string nliModelDirectory, CancellationToken cancellationToken) =>
    [
        await NliAsync(nliModelDirectory, cancellationToken),
        await SolverAsync(cancellationToken),
        await CacheAsync(model, cancellationToken),
        await ModelAsync(model, cancellationToken),
    ];

    private async Task<SetUpCheck> NliAsync(string directory, CancellationToken cancellationToken)
    {
        const string name = "NLI model";
        var clock = Stopwatch.StartNew();
        try
        {
            var scorer = root.OpenScorer(directory);
            try
            {
                var scores = await scorer.ScoreAsync([.. KnownPairs.Select(k => k.Pair)], cancellationToken);
                var read = KnownPairs.Zip(scores, (known, s) => (known.Expected, s.Kind, P: s.ProbabilityOf(known.Expected))).ToList();
                var detail = string.Join("; ", read.Select(r => string.Create(CultureInfo.InvariantCulture,
                    $"known {Word(r.Expected)} pair read as {Word(r.Kind)} (p {r.P:0.00})")));
                return read.All(r => r.Kind == r.Expected)
                    ? new SetUpCheck(name, SetUpOutcome.Ok, $"{scorer.Describe}; {detail}; {Seconds(clock)}")
                    : new SetUpCheck(name, SetUpOutcome.Failed,
                        $"{scorer.Describe}: {detail}; the labels may be in the wrong order (give them in nli-model.json beside the model), or the model is not a three-way NLI model");
            }
            finally
            {
                (scorer as IDisposable)?.Dispose();
            }
        }
        catch (Exception e) when (Guarded.UsageMessage(e) is { } message)
        {
            return new SetUpCheck(name, SetUpOutcome.Failed, $"{message}; fix: --nli-model DIR (a folder with model.onnx, config.json and the tokenizer file) or nli.model in the config file");
        }
    }

    private async Task<SetUpCheck> SolverAsync(CancellationToken cancellationToken)
    {
        const string name = "MAX-SAT solver";
        try
        {
            var solver = root.CreateClaimSolver();
            var solution = await solver.SolveAsync(KnownInstance, cancellationToken);
            return solution is { Status: SolveStatus.Optimal, Cost: 3 } && solution.Assignment is [true, false]
                ? new SetUpCheck(name, SetUpOutcome.Ok, string.Create(CultureInfo.InvariantCulture,
                    $"{solver.Describe}; proved the optimum (cost 3) of a known 2-variable instance in {solution.WallTime.TotalMilliseconds:0} ms"))
                : new SetUpCheck(name, SetUpOutcome.Failed, string.Create(CultureInfo.InvariantCulture,
                    $"{solver.Describe} gave {solution.Status}, cost {solution.Cost}, on an instance whose optimum is 3: reinstall plumb"));
        }
        catch (Exception e) when (e is DllNotFoundException or TypeInitializationException or BadImageFormatException or MaxSatSolverException)
        {
            return new SetUpCheck(name, SetUpOutcome.Failed, $"{e.Message}; the OR-Tools native library did not load: reinstall plumb for this platform (linux-x64, osx-arm64, win-x64 ...)");
        }
    }

    private async Task<SetUpCheck> CacheAsync(ModelSettings model, CancellationToken cancellationToken)
    {
        const string name = "response cache";
        if (!model.Cache.Enabled)
        {
            return new SetUpCheck(name, SetUpOutcome.Skipped, "turned off (--no-cache, or cache.enabled = false)");
        }

        var path = model.Cache.FilePath(root.Environment);
        try
        {
            await using var cache = await ResponseCache.OpenAsync(path, root.Time, cancellationToken);
            var count = await cache.CountAsync(cancellationToken);
            return new SetUpCheck(name, SetUpOutcome.Ok, string.Create(CultureInfo.InvariantCulture, $"{path} opened, {count} answers kept"));
        }
        catch (Exception e) when (Guarded.UsageMessage(e) is { } message)
        {
            return new SetUpCheck(name, SetUpOutcome.Failed, $"{message}; fix: --cache-dir DIR (a folder this user can write) or --no-cache");
        }
    }

    private async Task<SetUpCheck> ModelAsync(ModelSettings model, CancellationToken cancellationToken)
    {
        const string name = "model source";
        if (string.IsNullOrWhiteSpace(model.Source))
        {
            return new SetUpCheck(name, SetUpOutcome.Skipped, "none configured (--model, model.source in the config file, or PLUMB_MODEL)");
        }

        var clock = Stopwatch.StartNew();
        try
        {
            var opened = await (root.OpenModel ?? OpenFromRegistryAsync)(model, PromptBook.PromptVersion, cancellationToken);
            await using var source = opened.Model;
            var notes = opened.Notices.Count == 0 ? "" : "; note: " + string.Join("; ", opened.Notices);
            if (!opened.Cacheable)
            {
                return new SetUpCheck(name, SetUpOutcome.Ok, $"{source.Describe} read (a store of answers: no call made){notes}");
            }

            var answer = await source.ScoreAnswersAsync(new AnswerRequest(ProbeStatement, PromptBook.Answer(ProbeStatement)), cancellationToken);
            var memory = model.Source.StartsWith(LocalSourceKind.Prefix, StringComparison.OrdinalIgnoreCase)
                ? $"; resident memory {SystemMemory.Format(SystemMemory.Resident())}" + (SystemMemory.PeakResident() is { } peak ? $" (peak {SystemMemory.Format(peak)})" : "")
                : "";
            return new SetUpCheck(name, SetUpOutcome.Ok, string.Create(CultureInfo.InvariantCulture,
                $"{source.Describe} answered one request (p(true) {answer.True:0.00} for \"{ProbeStatement}\") in {Seconds(clock)}{memory}{notes}"));
        }
        catch (Exception e) when (Guarded.UsageMessage(e) is { } message)
        {
            return new SetUpCheck(name, SetUpOutcome.Failed, $"{message}; check --model, --model-name and the API key variable (--api-key-env)");
        }
        catch (ModelRequestException e)
        {
            return new SetUpCheck(name, SetUpOutcome.Failed, $"{model.Source} opened, but a request failed: {e.Message}; check --model-name and the API key variable (--api-key-env)");
        }
    }

    private Task<OpenedModel> OpenFromRegistryAsync(ModelSettings settings, string promptVersion, CancellationToken cancellationToken) =>
        ModelComposition.OpenAsync(settings, promptVersion, root.Environment, root.Time, cancellationToken);

    private static string Word(EntailmentKind kind) => kind.ToString().ToLowerInvariant();

    private static string Seconds(Stopwatch clock) => clock.Elapsed.TotalSeconds.ToString("0.0 s", CultureInfo.InvariantCulture);
}
