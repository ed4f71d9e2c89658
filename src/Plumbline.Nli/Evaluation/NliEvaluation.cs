using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Evaluation;

/// <summary>How a scorer did on a labelled set: accuracy, per-class precision and recall, confusion matrix, speed.</summary>
/// <param name="Model">The scorer's description (model name and hash).</param>
/// <param name="Elapsed">Wall-clock time spent scoring.</param>
/// <param name="TruncatedPairs">Pairs cut to the model's maximum length (0 when the scorer cannot tell).</param>
/// <param name="CalibrationError">Expected calibration error of the predicted class's probability (<see cref="CalibrationBins"/>).</param>
public sealed record NliEvaluation(string Model, NliConfusionMatrix Confusion, TimeSpan Elapsed, int TruncatedPairs, double CalibrationError = 0)
{
    /// <summary>Pairs whose gold label is entailment or neutral.</summary>
    public int NotContradictionPairs => Confusion.GoldCount(EntailmentKind.Entailment) + Confusion.GoldCount(EntailmentKind.Neutral);

    /// <summary>Pairs whose gold label is entailment or neutral that the model reads as contradiction.</summary>
    public int FalseContradictions =>
        Confusion[EntailmentKind.Entailment, EntailmentKind.Contradiction] + Confusion[EntailmentKind.Neutral, EntailmentKind.Contradiction];

    /// <summary>
    /// Share of the pairs whose gold label is not contradiction that the model reads as contradiction; null when
    /// every pair is a contradiction. In an explanation tree each such error becomes a wrong clause.
    /// </summary>
    public double? FalseContradictionRate => NotContradictionPairs == 0 ? null : (double)FalseContradictions / NotContradictionPairs;

    public int Pairs => Confusion.Total;

    public int Correct => Confusion.Correct;

    public double Accuracy => Pairs == 0 ? 0 : (double)Correct / Pairs;

    public double PairsPerSecond => Elapsed > TimeSpan.Zero ? Pairs / Elapsed.TotalSeconds : 0;

    public IReadOnlyList<NliClassMetrics> Classes =>
        NliConfusionMatrix.Kinds
            .Select(kind => new NliClassMetrics(kind, Confusion.GoldCount(kind), Confusion.PredictedCount(kind), Confusion[kind, kind]))
            .ToArray();
}
