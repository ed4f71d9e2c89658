using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

/// <summary>Our ONNX Runtime logits against the recipe's exact emulation of the int8 graph, via reference/logits.jsonl.</summary>
[Collection(RepositoryModelCollection.Name)]
public sealed class LogitParityTests(ModelFixture fixture)
{
    private const double Tolerance = 1e-3;

    [Fact]
    public async Task ScorePairs_ReferencePairsBatchedAsInProduction_LogitsMatchInt8EmulationWithinTolerance()
    {
        var references = RepositoryModel.LogitReferences();
        Assert.NotEmpty(references);
        using var scorer = new OnnxEntailmentScorer(fixture.Model, new NliScorerOptions { Cache = false });

        var scored = await scorer.ScorePairsAsync(references.Select(r => new SentencePair(r.Premise, r.Hypothesis)).ToArray(), CancellationToken.None);

        var worst = references.Zip(scored)
            .SelectMany(item => item.First.Int8Logits.Zip(item.Second.Logits, (expected, actual) => Math.Abs(expected - (double)actual)))
            .Max();
        Assert.True(worst <= Tolerance, $"largest logit difference {worst:G4} exceeds {Tolerance}");
    }

    [Fact]
    public async Task ScoreAsync_ReferencePairs_AreSoftmaxOfLogitsInCardLabelOrder()
    {
        var reference = RepositoryModel.LogitReferences()[0];
        using var scorer = new OnnxEntailmentScorer(fixture.Model);
        var labels = fixture.Model.Card.Labels.Select(label => label.ToLowerInvariant()).ToList();

        var scores = (await scorer.ScoreAsync([new SentencePair(reference.Premise, reference.Hypothesis)], CancellationToken.None))[0];

        var exp = reference.Int8Logits.Select(logit => Math.Exp(logit)).ToArray();
        var total = exp.Sum();
        Assert.Equal(exp[labels.IndexOf("entailment")] / total, scores.Entailment, 1e-3);
        Assert.Equal(exp[labels.IndexOf("neutral")] / total, scores.Neutral, 1e-3);
        Assert.Equal(exp[labels.IndexOf("contradiction")] / total, scores.Contradiction, 1e-3);
    }
}
