using System.Security.Cryptography;
using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

[Collection(RepositoryModelCollection.Name)]
public sealed class ScorerBatchingTests(ModelFixture fixture)
{
    // Lengths from 3 tokens to the maximum, with a repeat, so sorting, padding and restoring order all matter.
    private static readonly SentencePair[] MixedLengths =
    [
        new("A man is playing a guitar on a small stage in front of a quiet crowd of people.", "Someone is making music."),
        new("", ""),
        new("Dogs run.", "Animals move."),
        new(string.Join(' ', Enumerable.Repeat("The committee reviewed the long report carefully", 20)), "The committee read a report."),
        new("The sky is blue.", "The sky is not blue."),
        new("Dogs run.", "Animals move."),
        new("A woman reads a book in the park while her children play on the swings nearby.", "A woman is reading."),
        new("Two red cars.", ""),
        new("It rained all day in the city, and the streets were flooded by the evening.", "The streets stayed dry."),
    ];

    [Fact]
    public async Task ScoreAsync_MixedLengthBatch_EqualsScoringEachPairAlone()
    {
        using var batched = new OnnxEntailmentScorer(fixture.Model, new NliScorerOptions { BatchSize = 4, Cache = false });
        using var single = new OnnxEntailmentScorer(fixture.Model, new NliScorerOptions { BatchSize = 1, Cache = false });

        var together = await batched.ScorePairsAsync(MixedLengths, CancellationToken.None);
        var alone = new List<ScoredPair>();
        foreach (var pair in MixedLengths)
        {
            alone.Add((await single.ScorePairsAsync([pair], CancellationToken.None))[0]);
        }

        Assert.Equal(MixedLengths.Length, together.Length);
        for (var i = 0; i < MixedLengths.Length; i++)
        {
            for (var label = 0; label < 3; label++)
            {
                Assert.Equal(alone[i].Logits[label], together[i].Logits[label], 1e-4);
            }

            Assert.Equal(alone[i].Scores.Entailment, together[i].Scores.Entailment, 1e-4);
            Assert.Equal(alone[i].Scores.Contradiction, together[i].Scores.Contradiction, 1e-4);
        }
    }

    [Fact]
    public async Task ScoreAsync_MixedLengthBatch_KeepsInputOrder()
    {
        using var scorer = new OnnxEntailmentScorer(fixture.Model, new NliScorerOptions { BatchSize = 3, Cache = false });

        var forward = await scorer.ScorePairsAsync(MixedLengths, CancellationToken.None);
        var backward = await scorer.ScorePairsAsync(MixedLengths.Reverse().ToArray(), CancellationToken.None);

        // Pairs of different text must not get the same logits, or the order check below would prove nothing.
        Assert.NotEqual(forward[0].Logits, forward[2].Logits);
        for (var i = 0; i < MixedLengths.Length; i++)
        {
            Assert.Equal(forward[i].Logits[0], backward[MixedLengths.Length - 1 - i].Logits[0], 1e-4);
        }
    }

    [Fact]
    public async Task ScoreAsync_RepeatedPairs_CacheReturnsIdenticalValues()
    {
        using var scorer = new OnnxEntailmentScorer(fixture.Model);

        var first = await scorer.ScoreAsync(MixedLengths, CancellationToken.None);
        var hitsBefore = scorer.CacheHits;
        var second = await scorer.ScoreAsync(MixedLengths, CancellationToken.None);

        Assert.Equal(first, second);
        Assert.Equal(MixedLengths.Length, scorer.CacheHits - hitsBefore);
    }

    [Fact]
    public async Task ScoreAsync_LongPair_CountedTruncatedOnceAcrossCalls()
    {
        using var scorer = new OnnxEntailmentScorer(fixture.Model);

        var details = await scorer.ScoreWithDetailsAsync(MixedLengths, CancellationToken.None);
        await scorer.ScoreAsync(MixedLengths, CancellationToken.None);

        Assert.Equal([false, false, false, true, false, false, false, false, false], details.Select(result => result.Truncated));
        Assert.Equal(1, scorer.TruncatedPairs);
    }

    [Fact]
    public async Task ScoreAsync_EmptyStrings_ScoredAsProbabilities()
    {
        using var scorer = new OnnxEntailmentScorer(fixture.Model);

        var scores = await scorer.ScoreAsync([new SentencePair(string.Empty, string.Empty), new SentencePair(string.Empty, "Something.")], CancellationToken.None);

        Assert.All(scores, score =>
        {
            Assert.Equal(1.0, score.Entailment + score.Neutral + score.Contradiction, 1e-9);
            Assert.InRange(score.Entailment, 0.0, 1.0);
        });
    }

    [Fact]
    public async Task ScoreAsync_EmptyList_ReturnsEmpty()
    {
        using var scorer = new OnnxEntailmentScorer(fixture.Model);

        Assert.Empty(await scorer.ScoreAsync([], CancellationToken.None));
    }

    [Fact]
    public async Task ScoreAsync_ConcurrentCallers_GetTheSameScoresAsOneCaller()
    {
        using var reference = new OnnxEntailmentScorer(fixture.Model, new NliScorerOptions { Cache = false });
        var expected = await reference.ScoreAsync(MixedLengths, CancellationToken.None);
        using var shared = new OnnxEntailmentScorer(fixture.Model);

        var results = await Task.WhenAll(Enumerable.Range(0, 4).Select(_ => Task.Run(() => shared.ScoreAsync(MixedLengths, CancellationToken.None))));

        Assert.All(results, result =>
        {
            for (var i = 0; i < expected.Count; i++)
            {
                Assert.Equal(expected[i].Entailment, result[i].Entailment, 1e-4);
            }
        });
        Assert.All(results, result => Assert.Equal(results[0], result));
    }

    [Fact]
    public async Task ScoreAsync_CancelledToken_Throws()
    {
        using var scorer = new OnnxEntailmentScorer(fixture.Model);

        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => scorer.ScoreAsync(MixedLengths, new CancellationToken(canceled: true)));
    }

    [Fact]
    public void Describe_NamesModelAndShortHashOfModelFile()
    {
        using var scorer = new OnnxEntailmentScorer(fixture.Model);
        var hash = Convert.ToHexStringLower(SHA256.HashData(File.ReadAllBytes(RepositoryModel.File("model.onnx"))));

        Assert.Contains(fixture.Model.Card.Name, scorer.Describe, StringComparison.Ordinal);
        Assert.Contains(hash[..12], scorer.Describe, StringComparison.Ordinal);
        Assert.Equal(hash, fixture.Model.ModelSha256);
    }
}
