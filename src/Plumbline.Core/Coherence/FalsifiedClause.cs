namespace Plumbline.Core.Coherence;

/// <summary>A soft clause an assignment breaks; <see cref="Weight"/> is in clause-weight units (scaled weight / scale).</summary>
/// <param name="Index">The clause's position in the claim's problem (as in an exported WCNF file, counting from 0).</param>
/// <param name="Origin">Why the clause exists.</param>
/// <param name="Literals">The clause's literals (DIMACS variables of the problem).</param>
/// <param name="Weight">Its weight in clause-weight units.</param>
public sealed record FalsifiedClause(int Index, ClauseOrigin Origin, IReadOnlyList<int> Literals, double Weight);
