using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>The engine settings that decide how a tree and its NLI scores become clauses.</summary>
internal sealed record ClauseRules(
    ClauseWeighting Weighting,
    int Scale,
    BeliefForm BeliefForm = BeliefForm.Ratio,
    double LinkFloor = 0.0,
    ConflictRule Conflicts = ConflictRule.Keep,
    ContradictionCount Contradictions = ContradictionCount.EachDirection,
    NliText NliText = NliText.Statement,
    bool ClaimBelief = false)
{
    public static ClauseRules From(CoherenceOptions options) => new(
        options.Weighting,
        options.WeightScale,
        options.BeliefForm,
        options.LinkFloor,
        options.Conflicts,
        options.Contradictions,
        options.NliText,
        options.ClaimBelief);
}
