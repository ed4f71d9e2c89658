using System.Diagnostics;
using System.Globalization;
using Microsoft.ML.OnnxRuntime;
using Plumbline.Core.Entailment;
using Plumbline.Nli;

namespace Plumbline.Benchmarks;

/// <summary>
/// NLI scorer speed on pairs of about 45 tokens: the scorer's pairs per second against session.Run alone on the
/// very tensors the scorer builds (the scorer's own cost is tokenising, batching, softmax and bookkeeping), and
/// the cold start of loading the model and scoring four pairs.
/// </summary>
internal static class NliBenchmark
{
    private const double TargetPairsPerSecond = 300;
    private const double TargetRatio = 0.9;
    private const double TargetColdStartSeconds = 0.5;

    // Words that are one WordPiece token each, so a sentence of n words is n tokens plus its full stop.
    private static readonly string[] Words =
        "the a man woman child dog cat bird park city street house garden river car train book table chair window door "
            .Split(' ', StringSplitOptions.RemoveEmptyEntries)
            .Concat("runs walks reads plays sits stands waits looks sleeps eats near under over behind beside with without old young small large red blue green quiet loud".Split(' '))
            .ToArray();

    public static async Task<int> RunAsync(string[] args, TextWriter output, TextWriter error)
    {
        int pairCount = 512, batchSize = 32, runs = 3, intraOp = new NliModelOptions().IntraOpThreads;
        string? directory = null;
        for (var i = 0; i < args.Length; i++)
        {
            var next = i + 1 < args.Length ? args[i + 1] : null;
            var value = next is not null && int.TryParse(next, NumberStyles.None, CultureInfo.InvariantCulture, out var parsed) && parsed > 0 ? parsed : (int?)null;
            switch (args[i])
            {
                case "--pairs" when value is { } n: pairCount = n; i++; break;
                case "--batch" when value is { } n: batchSize = n; i++; break;
                case "--runs" when value is { } n: runs = n; i++; break;
                case "--intra-op" when value is { } n: intraOp = n; i++; break;
                case "--model" when next is not null: directory = next; i++; break;
                default:
                    error.WriteLine($"nli: bad option '{args[i]}' (expected --model DIR, --pairs N, --batch N, --runs N or --intra-op N with N > 0)");
                    return 2;
            }
        }

        directory ??= RepositoryPaths.ShippedNliModel();
        var pairs = MakePairs(pairCount, new Random(17));

        // Cold start first, while nothing is loaded or compiled yet in this process.
        var cold = Stopwatch.StartNew();
        NliModel model;
        try
        {
            var modelOptions = new NliModelOptions { IntraOpThreads = intraOp };
            using var first = OnnxEntailmentScorer.Load(directory, modelOptions: modelOptions);
            await first.ScoreAsync(pairs.Take(4).ToArray(), CancellationToken.None);
            cold.Stop();
            model = NliModel.Load(directory, modelOptions);
        }
        catch (NliModelException e)
        {
            error.WriteLine($"nli: {e.Message}");
            return 2;
        }

        using (model)
        {
            using var scorer = new OnnxEntailmentScorer(model, new NliScorerOptions { BatchSize = batchSize, Cache = false });
            var batches = model.CreateBatches(pairs, batchSize);
            try
            {
                await scorer.ScoreAsync(pairs.Take(batchSize).ToArray(), CancellationToken.None);
                RunRaw(model, batches.Take(1));

                var scored = new List<TimeSpan>(runs);
                var raw = new List<TimeSpan>(runs);
                var tokenised = new List<TimeSpan>(runs);
                for (var run = 0; run < runs; run++)
                {
                    // Alternate the two so that load from other processes falls on both alike.
                    var watch = Stopwatch.StartNew();
                    await scorer.ScoreAsync(pairs, CancellationToken.None);
                    scored.Add(watch.Elapsed);
                    watch.Restart();
                    RunRaw(model, batches);
                    raw.Add(watch.Elapsed);
                    watch.Restart();
                    foreach (var batch in model.CreateBatches(pairs, batchSize))
                    {
                        batch.Dispose();
                    }

                    tokenised.Add(watch.Elapsed);
                }

                var scorerRate = pairCount / (Timing.Of(scored).Median / 1000);
                var rawRate = pairCount / (Timing.Of(raw).Median / 1000);
                var tokens = batches.Sum(batch => batch.SequenceLength * batch.Count) / (double)pairCount;
                output.WriteLine($"nli scorer: {model.Describe}");
                output.WriteLine(FormattableString.Invariant(
                    $"{pairCount} pairs, {tokens:0.0} tokens per padded pair, batches of {batchSize}, {runs} runs, {Environment.ProcessorCount} cores, {intraOp} intra-op threads per batch, {model.ConcurrentRuns} batches at once"));
                output.WriteLine($"scorer          {Timing.Of(scored)}");
                output.WriteLine($"session.Run     {Timing.Of(raw)}");
                output.WriteLine($"tokenise + pad  {Timing.Of(tokenised)}");
                output.WriteLine(FormattableString.Invariant($"scorer {scorerRate:0} pairs/s, session.Run {rawRate:0} pairs/s, ratio {scorerRate / rawRate:0.00}"));
                output.WriteLine(FormattableString.Invariant($"cold start (load + score 4 pairs) {cold.Elapsed.TotalSeconds:0.000} s"));
                output.WriteLine(FormattableString.Invariant($"target scorer >= {TargetPairsPerSecond} pairs/s: {Met(scorerRate >= TargetPairsPerSecond)}"));
                output.WriteLine(FormattableString.Invariant($"target ratio >= {TargetRatio}: {Met(scorerRate / rawRate >= TargetRatio)}"));
                output.WriteLine(FormattableString.Invariant($"target cold start <= {TargetColdStartSeconds} s: {Met(cold.Elapsed.TotalSeconds <= TargetColdStartSeconds)}"));
            }
            finally
            {
                foreach (var batch in batches)
                {
                    batch.Dispose();
                }
            }
        }

        return 0;
    }

    // As many batches at once as the scorer runs, so the ratio measures the scorer's own overhead.
    private static void RunRaw(NliModel model, IEnumerable<NliTensorBatch> batches) =>
        Parallel.ForEach(batches, new ParallelOptions { MaxDegreeOfParallelism = model.ConcurrentRuns }, batch =>
        {
            using var runOptions = new RunOptions();
            using var outputs = model.Session.Run(runOptions, batch.InputNames, batch.Values, model.OutputNames);
        });

    // About 45 tokens per pair with [CLS] and two [SEP]: a premise of 19 to 23 words, a hypothesis of 17 to 21.
    private static SentencePair[] MakePairs(int count, Random random)
    {
        string Sentence(int words) =>
            string.Join(' ', Enumerable.Range(0, words).Select(_ => Words[random.Next(Words.Length)])) + ".";
        return Enumerable.Range(0, count)
            .Select(_ => new SentencePair(Sentence(random.Next(19, 24)), Sentence(random.Next(17, 22))))
            .ToArray();
    }

    private static string Met(bool met) => met ? "met" : "NOT met";
}
