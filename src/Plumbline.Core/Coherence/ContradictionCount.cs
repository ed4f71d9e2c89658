namespace Plumbline.Core.Coherence;

/// <summary>How many clauses a contradiction between two statements adds.</summary>
public enum ContradictionCount
{
    /// <summary>One clause per direction the NLI model reads as contradiction (up to two for a pair).</summary>
    EachDirection,

    /// <summary>
    /// One clause per unordered pair, however many directions read as contradiction: "a and b are not both
    /// true" is one constraint, so a pair read both ways does not weigh twice as much as an entailment.
    /// </summary>
    OncePerPair,
}
