using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>Settings of the engine for one run.</summary>
/// <param name="Shape">How the explanation tree grows.</param>
/// <param name="Negation">How negations are obtained.</param>
/// <param name="Weighting">Weight of consistency clauses.</param>
/// <param name="WeightScale">Factor turning real clause weights into the solver's integers (rounded).</param>
/// <param name="ContestedThreshold">A margin at or below this (in clause-weight units) makes the claim contested.</param>
/// <param name="PromptVersion">Version of the prompt templates, recorded in reports and request fingerprints.</param>
public sealed record CoherenceOptions(
    TreeShape Shape,
    NegationMode Negation = NegationMode.Model,
    ClauseWeighting Weighting = ClauseWeighting.Unit,
    int WeightScale = 1000,
    double ContestedThreshold = 0.0,
    string PromptVersion = PromptBook.PromptVersion)
{
    public static CoherenceOptions Default { get; } = new(TreeShape.Default);
}
