using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

public sealed class PairScoreCacheTests
{
    private static ScoredPair Scored(float logit) => new(new EntailmentScores(1, 0, 0), false, [logit, 0, 0]);

    private static SentencePair Pair(int i) => new($"premise {i}", "hypothesis");

    [Fact]
    public void GetOrAdd_ManyMorePairsThanCapacity_NeverHoldsMoreThanCapacity()
    {
        var cache = new PairScoreCache(capacity: 10);

        for (var i = 0; i < 1000; i++)
        {
            cache.GetOrAdd(Pair(i), Scored(i), out _);
            Assert.True(cache.Count <= 10, $"{cache.Count} pairs held after {i + 1} stores");
        }
    }

    [Fact]
    public void TryGet_PairUsedAgainWhileOthersArrive_SurvivesEviction()
    {
        var cache = new PairScoreCache(capacity: 4);
        cache.GetOrAdd(Pair(0), Scored(0), out _);

        // Each round stores a new pair and reads pair 0 again, which moves it to the newest generation.
        for (var i = 1; i < 50; i++)
        {
            cache.GetOrAdd(Pair(i), Scored(i), out _);
            Assert.True(cache.TryGet(Pair(0), out var kept), $"pair 0 lost after {i} other stores");
            Assert.Equal(0f, kept.Logits[0]);
        }

        // A pair not read again is gone once two generations have passed.
        Assert.False(cache.TryGet(Pair(1), out _));
    }

    [Fact]
    public void GetOrAdd_SecondStoreOfSamePair_ReturnsFirstValue()
    {
        var cache = new PairScoreCache(capacity: 8);

        var first = cache.GetOrAdd(Pair(1), Scored(1), out var addedFirst);
        var second = cache.GetOrAdd(Pair(1), Scored(2), out var addedSecond);

        Assert.True(addedFirst);
        Assert.False(addedSecond);
        Assert.Same(first, second);
    }
}
