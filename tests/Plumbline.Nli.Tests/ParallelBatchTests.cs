using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

/// <summary>A call's batches run side by side (<see cref="NliModelOptions.ConcurrentRuns"/>); scores must not notice.</summary>
public sealed class ParallelBatchTests
{
    private static readonly SentencePair[] Pairs = Enumerable.Range(0, 40)
        .Select(i => new SentencePair(
            $"Shop {i} sells {i % 7 + 2} kinds of kettle and opens at {i % 5 + 7} in the morning.",
            i % 3 == 0 ? $"Shop {i} sells no kettles." : $"Shop {i} opens in the morning."))
        .ToArray();

    [Fact]
    public async Task ScoreAsync_FourBatchesAtOnce_SameLogitsAsOneAtATime()
    {
        using var serial = NliModel.Load(RepositoryModel.Directory, new NliModelOptions { ConcurrentRuns = 1 });
        using var parallel = NliModel.Load(RepositoryModel.Directory, new NliModelOptions { ConcurrentRuns = 4 });
        using var one = new OnnxEntailmentScorer(serial, new NliScorerOptions { BatchSize = 3, Cache = false });
        using var four = new OnnxEntailmentScorer(parallel, new NliScorerOptions { BatchSize = 3, Cache = false });

        var expected = await one.ScorePairsAsync(Pairs, CancellationToken.None);
        var actual = await four.ScorePairsAsync(Pairs, CancellationToken.None);

        Assert.Equal(1, serial.ConcurrentRuns);
        Assert.Equal(4, parallel.ConcurrentRuns);
        // Different texts get different logits, so a row written to the wrong position would show.
        Assert.NotEqual(expected[0].Logits, expected[3].Logits);
        for (var i = 0; i < Pairs.Length; i++)
        {
            Assert.Equal(expected[i].Logits, actual[i].Logits);
        }
    }

    [Fact]
    public async Task ScoreAsync_BatchFails_ThrowsTheBatchsOwnExceptionNotAnAggregate()
    {
        var model = NliModel.Load(RepositoryModel.Directory, new NliModelOptions { ConcurrentRuns = 4 });
        using var scorer = new OnnxEntailmentScorer(model, new NliScorerOptions { BatchSize = 2, Cache = false });
        model.Dispose();

        await Assert.ThrowsAsync<ObjectDisposedException>(() => scorer.ScoreAsync(Pairs, CancellationToken.None));
    }

    [Fact]
    public void Options_Defaults_OneThreadPerBatchAndOneBatchPerCore()
    {
        using var model = NliModel.Load(RepositoryModel.Directory);

        Assert.Equal(1, new NliModelOptions().IntraOpThreads);
        Assert.Equal(Environment.ProcessorCount, model.ConcurrentRuns);
        Assert.Throws<ArgumentOutOfRangeException>(() => NliModel.Load(RepositoryModel.Directory, new NliModelOptions { IntraOpThreads = 0 }));
        Assert.Throws<ArgumentOutOfRangeException>(() => NliModel.Load(RepositoryModel.Directory, new NliModelOptions { ConcurrentRuns = 0 }));
    }
}
