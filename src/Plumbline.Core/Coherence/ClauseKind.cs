namespace Plumbline.Core.Coherence;

/// <summary>Why a clause is in a claim's MAX-SAT problem.</summary>
public enum ClauseKind
{
    /// <summary>A unit clause for an integral leaf, weighted by its belief.</summary>
    Belief,

    /// <summary>A link: the premise entails the hypothesis (premise implies hypothesis).</summary>
    Entailment,

    /// <summary>A link: the premise contradicts the hypothesis (not both).</summary>
    Contradiction,

    /// <summary>A hard clause fixing a statement's value (used for the two solves behind the margin).</summary>
    Pin,
}
