namespace Plumbline.Core.Coherence;

/// <summary>
/// A statement pair the NLI model reads as entailment one way and contradiction the other way.
/// <see cref="Dropped"/> is true when neither direction became a clause.
/// </summary>
public sealed record LinkConflict(Link Entailment, Link Contradiction, bool Dropped);
