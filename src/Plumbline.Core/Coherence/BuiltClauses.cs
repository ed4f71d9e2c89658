namespace Plumbline.Core.Coherence;

/// <summary>The MAX-SAT problem of a tree, the links that produced its consistency clauses, and the conflicting pairs.</summary>
internal sealed record BuiltClauses(CoherenceProblem Problem, IReadOnlyList<Link> Links, IReadOnlyList<LinkConflict> Conflicts);
