using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

/// <summary>The card's temperature divides the logits before the softmax; the logits themselves are untouched.</summary>
public sealed class TemperatureScalingTests
{
    private static readonly SentencePair Pair = new("A man is sleeping on a bench.", "A man is awake.");

    [Fact]
    public async Task ScoreAsync_CardTemperature_GivesSoftmaxOfLogitsOverTemperature()
    {
        using var plain = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("nli-model.json", """{ "labels": ["entailment", "neutral", "contradiction"], "temperature": 1.0 }""");
        using var warm = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("nli-model.json", """{ "labels": ["entailment", "neutral", "contradiction"], "temperature": 2.5 }""");
        using var plainScorer = OnnxEntailmentScorer.Load(plain.Path);
        using var warmScorer = OnnxEntailmentScorer.Load(warm.Path);

        var logits = (await plainScorer.ScorePairsAsync([Pair], CancellationToken.None))[0].Logits;
        var scaled = (await warmScorer.ScorePairsAsync([Pair], CancellationToken.None))[0];

        Assert.Equal(logits, scaled.Logits);
        var exps = logits.Select(logit => Math.Exp(logit / 2.5)).ToArray();
        var total = exps.Sum();
        Assert.Equal(exps[0] / total, scaled.Scores.Entailment, 9);
        Assert.Equal(exps[1] / total, scaled.Scores.Neutral, 9);
        Assert.Equal(exps[2] / total, scaled.Scores.Contradiction, 9);
        // Softening keeps the order of the classes but moves the top probability towards a third.
        var sharp = (await plainScorer.ScoreAsync([Pair], CancellationToken.None))[0];
        Assert.Equal(sharp.Kind, scaled.Scores.Kind);
        Assert.True(scaled.Scores.ProbabilityOf(scaled.Scores.Kind) < sharp.ProbabilityOf(sharp.Kind));
    }
}
