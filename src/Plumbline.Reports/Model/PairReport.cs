using Plumbline.Core.Entailment;

namespace Plumbline.Reports.Model;

/// <summary>An unordered pair of statements, listed once, with the NLI scores of both directions.</summary>
/// <param name="First">The lower statement id.</param>
/// <param name="Second">The higher statement id.</param>
/// <param name="Forward">Scores with <paramref name="First"/> as premise.</param>
/// <param name="Backward">Scores with <paramref name="Second"/> as premise.</param>
/// <param name="Linked">At least one direction became a link.</param>
public sealed record PairReport(int First, int Second, EntailmentScores Forward, EntailmentScores Backward, bool Linked)
{
    /// <summary>True when either direction's most likely label is contradiction.</summary>
    public bool IsContradiction => Forward.Kind == EntailmentKind.Contradiction || Backward.Kind == EntailmentKind.Contradiction;
}
