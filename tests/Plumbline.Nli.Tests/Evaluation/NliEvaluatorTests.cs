using Plumbline.Core.Entailment;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Nli.Tests.Evaluation;

public sealed class NliEvaluatorTests
{
    private static readonly EntailmentScores SaysEntailment = new(0.8, 0.1, 0.1);
    private static readonly EntailmentScores SaysNeutral = new(0.1, 0.8, 0.1);
    private static readonly EntailmentScores SaysContradiction = new(0.1, 0.1, 0.8);

    [Fact]
    public async Task EvaluateAsync_HandComputedConfusion_GivesAccuracyPrecisionRecallAndSpeed()
    {
        // Gold E: predicted E, E, N; gold N: N, C; gold C: C, C, E. By hand: 5 of 8 correct;
        // precision E 2/3, N 1/2, C 2/3; recall E 2/3, N 1/2, C 2/3.
        var outcomes = new (EntailmentKind Gold, EntailmentScores Predicted)[]
        {
            (EntailmentKind.Entailment, SaysEntailment), (EntailmentKind.Entailment, SaysEntailment), (EntailmentKind.Entailment, SaysNeutral),
            (EntailmentKind.Neutral, SaysNeutral), (EntailmentKind.Neutral, SaysContradiction),
            (EntailmentKind.Contradiction, SaysContradiction), (EntailmentKind.Contradiction, SaysContradiction), (EntailmentKind.Contradiction, SaysEntailment),
        };
        var pairs = outcomes.Select((outcome, index) => new LabelledPair(new SentencePair($"premise {index}", "hypothesis"), outcome.Gold, index + 2)).ToArray();
        var scorer = new TableScorer(outcomes.Select((outcome, index) => ($"premise {index}", outcome.Predicted)));

        var evaluation = await NliEvaluator.EvaluateAsync(scorer, pairs, new SteppingTimeProvider(TimeSpan.FromSeconds(2)));

        Assert.Equal((8, 5, 0.625), (evaluation.Pairs, evaluation.Correct, evaluation.Accuracy));
        Assert.Equal(
            [(2.0 / 3, 2.0 / 3), (0.5, 0.5), (2.0 / 3, 2.0 / 3)],
            evaluation.Classes.Select(metrics => (metrics.Precision!.Value, metrics.Recall!.Value)));
        var matrix = evaluation.Confusion;
        Assert.Equal(
            [2, 1, 0, 0, 1, 1, 1, 0, 2],
            NliConfusionMatrix.Kinds.SelectMany(gold => NliConfusionMatrix.Kinds.Select(predicted => matrix[gold, predicted])));
        Assert.Equal(TimeSpan.FromSeconds(2), evaluation.Elapsed);
        Assert.Equal(4.0, evaluation.PairsPerSecond);
        Assert.Equal("table", evaluation.Model);
    }

    [Fact]
    public async Task EvaluateAsync_HandComputedConfusion_GivesFalseContradictionRateAndCalibrationError()
    {
        // Same eight outcomes as above. Gold not contradiction: 5 pairs (3 E, 2 N), of which one (N read as C) is
        // predicted contradiction: 1/5. Every prediction has probability 0.8, so all eight share the bin (0.733, 0.8];
        // its accuracy is 5/8, so the calibration error is |0.625 - 0.8| = 0.175.
        var outcomes = new (EntailmentKind Gold, EntailmentScores Predicted)[]
        {
            (EntailmentKind.Entailment, SaysEntailment), (EntailmentKind.Entailment, SaysEntailment), (EntailmentKind.Entailment, SaysNeutral),
            (EntailmentKind.Neutral, SaysNeutral), (EntailmentKind.Neutral, SaysContradiction),
            (EntailmentKind.Contradiction, SaysContradiction), (EntailmentKind.Contradiction, SaysContradiction), (EntailmentKind.Contradiction, SaysEntailment),
        };
        var pairs = outcomes.Select((outcome, index) => new LabelledPair(new SentencePair($"premise {index}", "hypothesis"), outcome.Gold, index + 2)).ToArray();
        var scorer = new TableScorer(outcomes.Select((outcome, index) => ($"premise {index}", outcome.Predicted)));

        var evaluation = await NliEvaluator.EvaluateAsync(scorer, pairs);

        Assert.Equal(0.2, evaluation.FalseContradictionRate!.Value, 12);
        Assert.Equal(0.175, evaluation.CalibrationError, 12);
    }

    [Fact]
    public async Task EvaluateAsync_OnlyContradictions_HasNoFalseContradictionRate()
    {
        LabelledPair[] pairs = [new(new SentencePair("p", "h"), EntailmentKind.Contradiction, 2)];

        var evaluation = await NliEvaluator.EvaluateAsync(new TableScorer([("p", SaysContradiction)]), pairs);

        Assert.Null(evaluation.FalseContradictionRate);
    }

    [Fact]
    public async Task EvaluateAsync_ClassNeverPredicted_HasNoPrecision()
    {
        LabelledPair[] pairs = [new(new SentencePair("p", "h"), EntailmentKind.Neutral, 2)];

        var evaluation = await NliEvaluator.EvaluateAsync(new TableScorer([("p", SaysEntailment)]), pairs);

        var neutral = evaluation.Classes.Single(metrics => metrics.Kind == EntailmentKind.Neutral);
        Assert.Null(neutral.Precision);
        Assert.Equal(0.0, neutral.Recall);
        Assert.Null(evaluation.Classes.Single(metrics => metrics.Kind == EntailmentKind.Contradiction).Recall);
        Assert.Equal(0.0, evaluation.Accuracy);
    }

    [Fact]
    public async Task EvaluateAsync_OnnxScorerOnTinyModel_CountsTruncationAndAgreesWithArgmax()
    {
        // The tiny model's own most probable classes as gold (data/tiny-bpe/expected.jsonl logits, id2label
        // contradiction, neutral, entailment): the first two pairs lean neutral, the third neutral as well.
        using var scorer = OnnxEntailmentScorer.Load(Path.Combine(AppContext.BaseDirectory, "data", "tiny-bpe"));
        var longPremise = string.Join(' ', Enumerable.Repeat("the cat sat", 8));
        var single = await scorer.ScoreAsync([new SentencePair(longPremise, "cat")], CancellationToken.None);
        LabelledPair[] pairs =
        [
            new(new SentencePair("a cat sat", "the cat"), EntailmentKind.Neutral, 1),
            new(new SentencePair("The cat", "cat"), EntailmentKind.Neutral, 2),
            new(new SentencePair("", "at"), EntailmentKind.Neutral, 3),
            new(new SentencePair(longPremise, "cat"), single[0].Kind, 4),
        ];

        var evaluation = await NliEvaluator.EvaluateAsync(scorer, pairs);

        Assert.Equal(1.0, evaluation.Accuracy);
        Assert.Equal(1, evaluation.TruncatedPairs);
        Assert.Equal(scorer.Describe, evaluation.Model);
    }

    private sealed class TableScorer(IEnumerable<(string Premise, EntailmentScores Scores)> table) : IEntailmentScorer
    {
        private readonly Dictionary<string, EntailmentScores> byPremise = table.ToDictionary(row => row.Premise, row => row.Scores);

        public string Describe => "table";

        public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken) =>
            Task.FromResult<IReadOnlyList<EntailmentScores>>(pairs.Select(pair => byPremise[pair.Premise]).ToArray());
    }

    /// <summary>Each timestamp read is one step later than the one before.</summary>
    private sealed class SteppingTimeProvider(TimeSpan step) : TimeProvider
    {
        private long ticks;

        public override long TimestampFrequency => TimeSpan.TicksPerSecond;

        public override long GetTimestamp() => Interlocked.Add(ref ticks, step.Ticks);
    }
}
