using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Evaluation;

/// <summary>Precision and recall of one class; null where undefined (nothing predicted, or no gold pair of the class).</summary>
public sealed record NliClassMetrics(EntailmentKind Kind, int Gold, int Predicted, int Correct)
{
    public double? Precision => Predicted == 0 ? null : (double)Correct / Predicted;

    public double? Recall => Gold == 0 ? null : (double)Correct / Gold;
}
