using Plumbline.Core.Entailment;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Nli.Tests;

/// <summary>
/// The shipped model against seeded samples of published dev sets (data/nli/SOURCES.md names each source).
/// The floors sit below the accuracies measured on the full sets (MODEL_CARD.md) by more than the
/// sampling error of the sample, so they fail on a real regression, not on noise.
/// </summary>
[Collection(RepositoryModelCollection.Name)]
public sealed class PublishedDevSetAccuracyTests(ModelFixture fixture)
{
    // Source: MultiNLI matched dev set (Williams et al., 2018), 500 pairs sampled with seed 20261201.
    // Full set measured 67.2%; floor 62% (about 2 standard errors of a 500-pair sample below it).
    [Fact]
    public async Task Accuracy_MultiNliMatchedDevSample_IsAtLeast62Percent()
    {
        var evaluation = await EvaluateAsync("mnli-matched-dev-500.csv", expectedPairs: 500);

        Assert.True(evaluation.Accuracy >= 0.62, $"accuracy {evaluation.Accuracy:P1} on {evaluation.Pairs} pairs");
    }

    // Source: Breaking NLI (Glockner et al., 2018), 300 contradiction pairs sampled with seed 20261201.
    [Fact]
    public async Task ContradictionRecall_BreakingNliSample_IsAtLeast50Percent()
    {
        var evaluation = await EvaluateAsync("breaking-nli-contradiction-300.csv", expectedPairs: 300);

        Assert.True(RecallOf(evaluation, EntailmentKind.Contradiction) >= 0.50, Describe(evaluation));
    }

    // Source: premises of the SNLI dev set (Bowman et al., 2015) with explicit negations in forms the
    // training data never uses (contractions, unseen prefixes); see models/recipe/negation_eval.py.
    [Fact]
    public async Task ContradictionRecall_HeldOutNegations_IsAtLeast95Percent()
    {
        var evaluation = await EvaluateAsync("negation-held-out-300.csv", expectedPairs: 300);

        Assert.True(RecallOf(evaluation, EntailmentKind.Contradiction) >= 0.95, Describe(evaluation));
    }

    private async Task<NliEvaluation> EvaluateAsync(string file, int expectedPairs)
    {
        var set = LabelledPairReader.Read(Path.Combine(AppContext.BaseDirectory, "data", "nli", file));
        Assert.Equal(expectedPairs, set.Pairs.Count);
        using var scorer = new OnnxEntailmentScorer(fixture.Model);
        return await NliEvaluator.EvaluateAsync(scorer, set.Pairs);
    }

    private static double RecallOf(NliEvaluation evaluation, EntailmentKind kind) =>
        evaluation.Classes.Single(c => c.Kind == kind).Recall ?? 0.0;

    private static string Describe(NliEvaluation evaluation) =>
        string.Join(", ", evaluation.Classes.Select(c => $"{c.Kind} recall {c.Recall:P1}")) + $" over {evaluation.Pairs} pairs";
}
