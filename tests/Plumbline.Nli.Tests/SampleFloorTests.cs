using Plumbline.Core.Entailment;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Nli.Tests;

/// <summary>
/// The shipped model against seeded samples of every evaluation file of the model card (data/nli/SOURCES.md names
/// each source; models/nli-eval/SOURCES.md the held-out sets the samples come from). Each threshold is the card's
/// floor for that figure where the model meets the floor on the full set; where it does not, the threshold sits
/// under the sample's measured figure and the comment says so, so the test still catches a regression.
/// </summary>
[Collection(RepositoryModelCollection.Name)]
public sealed class SampleFloorTests(ModelFixture fixture)
{
    // Source: MultiNLI matched dev (Williams et al., 2018), 500 pairs sampled with seed 20261201. Floor 68% (met:
    // 68.1% on the full set, MODEL_CARD.md; 69.4% on the sample).
    [Fact]
    public async Task Accuracy_MultiNliMatchedDevSample_IsAtLeast68Percent()
    {
        var evaluation = await EvaluateAsync("mnli-matched-dev-500.csv", expectedPairs: 500);

        Assert.True(evaluation.Accuracy >= 0.68, Describe(evaluation));
    }

    // Source: SNLI dev (Bowman et al., 2015), 500 pairs sampled with seed 20261201. Floor 79%: NOT met on the full
    // set (77.5%); the sample measures 75.4%, the threshold sits over one standard error below.
    [Fact]
    public async Task Accuracy_SnliDevSample_IsAtLeast73Percent()
    {
        var evaluation = await EvaluateAsync("snli-dev-500.csv", expectedPairs: 500);

        Assert.True(evaluation.Accuracy >= 0.73, Describe(evaluation));
    }

    // Source: Breaking NLI (Glockner et al., 2018), 300 contradiction pairs sampled with seed 20261201. Floor 85%
    // (met: 88.0% on the full set, 89.7% on the sample).
    [Fact]
    public async Task ContradictionRecall_BreakingNliSample_IsAtLeast85Percent()
    {
        var evaluation = await EvaluateAsync("breaking-nli-contradiction-300.csv", expectedPairs: 300);

        Assert.True(RecallOf(evaluation, EntailmentKind.Contradiction) >= 0.85, Describe(evaluation));
    }

    // Source: Breaking NLI, 300 entailment pairs (synonym and hypernym swaps) sampled with seed 20261201. Floor 70%
    // (met: 89.2% on the full set, 89.3% on the sample).
    [Fact]
    public async Task EntailmentRecall_BreakingNliSample_IsAtLeast70Percent()
    {
        var evaluation = await EvaluateAsync("breaking-nli-entailment-300.csv", expectedPairs: 300);

        Assert.True(RecallOf(evaluation, EntailmentKind.Entailment) >= 0.70, Describe(evaluation));
    }

    // Source: SNLI dev premises with explicit negations in forms the training data never uses (models/nli-eval,
    // negation-held-out.csv). Floor 95% (met: 95.1% on the full set, 95.3% on the sample).
    [Fact]
    public async Task ContradictionRecall_HeldOutNegations_IsAtLeast95Percent()
    {
        var evaluation = await EvaluateAsync("negation-held-out-300.csv", expectedPairs: 300);

        Assert.True(RecallOf(evaluation, EntailmentKind.Contradiction) >= 0.95, Describe(evaluation));
    }

    // Source: SNLI dev premises with one state word or WordNet antonym swapped in (models/nli-eval,
    // antonym-held-out.csv). No floor in the targets; 87.9% on the full set, 87.7% on the sample.
    [Fact]
    public async Task ContradictionRecall_HeldOutAntonyms_IsAtLeast80Percent()
    {
        var evaluation = await EvaluateAsync("antonym-held-out-300.csv", expectedPairs: 300);

        Assert.True(RecallOf(evaluation, EntailmentKind.Contradiction) >= 0.80, Describe(evaluation));
    }

    // Source: news paraphrase pairs of the curriculum benchmark's syntactic-variation task (models/nli-eval,
    // paraphrase-held-out.csv; about one in five differ in a number or a detail). Floor: at most 6% read as
    // contradiction: NOT met (22.6% on the full set, 22.0% on the sample); the threshold guards that level.
    [Fact]
    public async Task FalseContradictions_HeldOutParaphrases_AreAtMost25Percent()
    {
        var evaluation = await EvaluateAsync("paraphrase-held-out-300.csv", expectedPairs: 300);

        Assert.True(evaluation.FalseContradictionRate <= 0.25, Describe(evaluation));
    }

    // Source: MultiNLI matched dev and SNLI dev sentences with an added clause or modifier (models/nli-eval,
    // added-detail-held-out.csv). Floor: at most 10% read as contradiction (met: 0.4% on the full set, 0 of 300 on
    // the sample).
    [Fact]
    public async Task FalseContradictions_HeldOutAddedDetail_AreAtMost10Percent()
    {
        var evaluation = await EvaluateAsync("added-detail-held-out-300.csv", expectedPairs: 300);

        Assert.True(evaluation.FalseContradictionRate <= 0.10, Describe(evaluation));
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
        string.Join(", ", evaluation.Classes.Select(c => $"{c.Kind} recall {c.Recall:P1}"))
        + $", accuracy {evaluation.Accuracy:P1}, false contradictions {evaluation.FalseContradictionRate:P1} over {evaluation.Pairs} pairs";
}
