namespace Plumbline.Core.Coherence;

/// <summary>What to do with a statement pair whose two directions disagree (entailment one way, contradiction the other).</summary>
public enum ConflictRule
{
    /// <summary>Keep both links; the solver weighs them like any others.</summary>
    Keep,

    /// <summary>Drop both directions: the NLI model contradicts itself on the pair, so neither reading is trusted.</summary>
    Drop,
}
