namespace Plumbline.Core.Coherence;

/// <summary>The MAX-SAT problem of a tree and the links that produced its consistency clauses.</summary>
internal sealed record BuiltClauses(CoherenceProblem Problem, IReadOnlyList<Link> Links);
