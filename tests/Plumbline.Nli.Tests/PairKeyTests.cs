using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

public sealed class PairKeyTests
{
    [Fact]
    public void Of_SameTextsInNewStrings_SameKey()
    {
        var premise = string.Concat("A kettle ", "boils water.");
        var hypothesis = string.Concat("Water ", "boils.");

        Assert.Equal(PairKey.Of(new SentencePair("A kettle boils water.", "Water boils.")), PairKey.Of(new SentencePair(premise, hypothesis)));
    }

    [Fact]
    public void Of_BoundaryBetweenTextsMoved_DifferentKeys()
    {
        Assert.NotEqual(PairKey.Of(new SentencePair("ab", "c")), PairKey.Of(new SentencePair("a", "bc")));
    }

    [Fact]
    public void Of_DirectionSwapped_DifferentKeys()
    {
        Assert.NotEqual(PairKey.Of(new SentencePair("A dog runs.", "An animal moves.")), PairKey.Of(new SentencePair("An animal moves.", "A dog runs.")));
    }

    [Fact]
    public void Of_TenThousandDistinctPairs_TenThousandDistinctKeys()
    {
        var keys = new HashSet<UInt128>();
        for (var i = 0; i < 10_000; i++)
        {
            keys.Add(PairKey.Of(new SentencePair($"Statement {i}.", $"Statement {i % 97}.")));
        }

        Assert.Equal(10_000, keys.Count);
    }
}
