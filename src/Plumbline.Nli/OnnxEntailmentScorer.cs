using System.Runtime.ExceptionServices;
using Plumbline.Core.Entailment;
using Plumbline.Nli.Tokenization;

namespace Plumbline.Nli;

/// <summary>
/// Scores sentence pairs with an ONNX cross-encoder. Pairs are tokenised, sorted by length, run in batches padded
/// to their longest pair and returned in input order. Safe to call from several threads at once.
/// </summary>
public sealed class OnnxEntailmentScorer : IEntailmentScorer, IDisposable
{
    private readonly NliModel model;
    private readonly bool ownsModel;
    private readonly int batchSize;
    private readonly PairScoreCache? cache;
    private int truncatedPairs;
    private long cacheHits;

    /// <summary>Scores with a model the caller keeps and disposes.</summary>
    public OnnxEntailmentScorer(NliModel model, NliScorerOptions? options = null)
        : this(model, options ?? new NliScorerOptions(), ownsModel: false)
    {
    }

    private OnnxEntailmentScorer(NliModel model, NliScorerOptions options, bool ownsModel)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(options.BatchSize, 1, nameof(options));
        this.model = model;
        this.ownsModel = ownsModel;
        batchSize = options.BatchSize;
        ArgumentOutOfRangeException.ThrowIfLessThan(options.CacheCapacity, 2, nameof(options));
        cache = options.Cache ? new PairScoreCache(options.CacheCapacity) : null;
    }

    public NliModel Model => model;

    public string Describe => model.Describe;

    /// <summary>Distinct pairs scored so far that were cut to the model's maximum length (each counted once while cached).</summary>
    public int TruncatedPairs => Volatile.Read(ref truncatedPairs);

    /// <summary>Pairs answered from the cache instead of the model.</summary>
    public long CacheHits => Interlocked.Read(ref cacheHits);

    /// <summary>Loads a model directory and scores with it; disposing the scorer disposes the model.</summary>
    public static OnnxEntailmentScorer Load(string directory, NliScorerOptions? options = null, NliModelOptions? modelOptions = null) =>
        new(NliModel.Load(directory, modelOptions), options ?? new NliScorerOptions(), ownsModel: true);

    public async Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken)
    {
        var scored = await ScorePairsAsync(pairs, cancellationToken);
        return scored.Select(pair => pair.Scores).ToArray();
    }

    /// <summary>As <see cref="ScoreAsync"/>, with each pair's truncation flag.</summary>
    public async Task<IReadOnlyList<NliPairResult>> ScoreWithDetailsAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken)
    {
        var scored = await ScorePairsAsync(pairs, cancellationToken);
        return scored.Select(pair => new NliPairResult(pair.Scores, pair.Truncated)).ToArray();
    }

    internal Task<ScoredPair[]> ScorePairsAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken) =>
        pairs.Count == 0 ? Task.FromResult(Array.Empty<ScoredPair>()) : Task.Run(() => Score(pairs, cancellationToken), cancellationToken);

    public void Dispose()
    {
        if (ownsModel)
        {
            model.Dispose();
        }
    }

    private ScoredPair[] Score(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken)
    {
        var results = new ScoredPair[pairs.Count];

        // Each distinct pair is run once per call, even with the cache off; repeats share its result.
        var waiting = new Dictionary<SentencePair, List<int>>();
        for (var i = 0; i < pairs.Count; i++)
        {
            if (cache is not null && cache.TryGet(pairs[i], out var known))
            {
                results[i] = known;
                Interlocked.Increment(ref cacheHits);
            }
            else if (waiting.TryGetValue(pairs[i], out var positions))
            {
                positions.Add(i);
            }
            else
            {
                waiting.Add(pairs[i], [i]);
            }
        }

        var distinct = waiting.Keys.ToArray();
        var encoded = Encode(distinct);
        // A call's batches run side by side, each on one core's share of threads (NliModel bounds how many run at
        // once across all callers): one claim alone keeps every core busy, as several claims in flight do.
        var parallel = new ParallelOptions { MaxDegreeOfParallelism = model.ConcurrentRuns, CancellationToken = cancellationToken };
        try
        {
            Parallel.ForEach(LengthBuckets.Plan(encoded, batchSize), parallel, batch => ScoreBatch(batch, encoded, distinct, waiting, results));
        }
        catch (AggregateException e) when (e.InnerExceptions.Count >= 1)
        {
            // Callers handle the model's own failure types; the first batch's error is the one to report.
            ExceptionDispatchInfo.Capture(e.InnerExceptions[0]).Throw();
        }

        return results;
    }

    private void ScoreBatch(int[] batch, EncodedPair[] encoded, SentencePair[] distinct, Dictionary<SentencePair, List<int>> waiting, ScoredPair[] results)
    {
        var logits = RunBatch(batch.Select(index => encoded[index]).ToArray());
        for (var row = 0; row < batch.Length; row++)
        {
            var index = batch[row];
            var scored = Remember(distinct[index], logits.AsSpan(row * model.LabelCount, model.LabelCount).ToArray(), encoded[index].Truncated);
            // Batches hold distinct pairs, so no two threads write the same positions.
            foreach (var position in waiting[distinct[index]])
            {
                results[position] = scored;
            }
        }
    }

    // The pairs of one tree are every ordered pair of a few statements: each statement is tokenised once here and
    // its ids framed into every pair it takes part in.
    private EncodedPair[] Encode(SentencePair[] distinct)
    {
        var sides = new Dictionary<string, IReadOnlyList<int>>(StringComparer.Ordinal);
        IReadOnlyList<int> Side(string text)
        {
            if (!sides.TryGetValue(text, out var ids))
            {
                ids = model.Tokenize(text);
                sides.Add(text, ids);
            }

            return ids;
        }

        return distinct.Select(pair => model.Frame(Side(pair.Premise), Side(pair.Hypothesis))).ToArray();
    }

    private float[] RunBatch(EncodedPair[] batch)
    {
        using var tensors = model.CreateBatch(batch);
        return model.Run(tensors);
    }

    // When two calls score the same new pair at once, the first stored result wins so every caller sees identical values.
    private ScoredPair Remember(SentencePair pair, float[] logits, bool truncated)
    {
        var scored = new ScoredPair(model.Labels.ToScores(logits), truncated, logits);
        if (cache is not null)
        {
            var stored = cache.GetOrAdd(pair, scored, out var added);
            if (!added)
            {
                return stored;
            }
        }

        if (truncated)
        {
            Interlocked.Increment(ref truncatedPairs);
        }

        return scored;
    }
}
