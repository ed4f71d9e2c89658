using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Evaluation;

/// <summary>Counts of gold label (row) against predicted label (column), in <see cref="EntailmentKind"/> order.</summary>
public sealed class NliConfusionMatrix
{
    public static readonly IReadOnlyList<EntailmentKind> Kinds = [EntailmentKind.Entailment, EntailmentKind.Neutral, EntailmentKind.Contradiction];

    private readonly int[,] counts = new int[3, 3];

    public int this[EntailmentKind gold, EntailmentKind predicted] => counts[(int)gold, (int)predicted];

    public int Total => Kinds.Sum(gold => Kinds.Sum(predicted => this[gold, predicted]));

    public int Correct => Kinds.Sum(kind => this[kind, kind]);

    public static NliConfusionMatrix From(IEnumerable<(EntailmentKind Gold, EntailmentKind Predicted)> outcomes)
    {
        var matrix = new NliConfusionMatrix();
        foreach (var (gold, predicted) in outcomes)
        {
            matrix.counts[(int)gold, (int)predicted]++;
        }

        return matrix;
    }

    /// <summary>Pairs whose gold label is <paramref name="kind"/>.</summary>
    public int GoldCount(EntailmentKind kind) => Kinds.Sum(predicted => this[kind, predicted]);

    /// <summary>Pairs the model labelled <paramref name="kind"/>.</summary>
    public int PredictedCount(EntailmentKind kind) => Kinds.Sum(gold => this[gold, kind]);
}
