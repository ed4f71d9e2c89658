namespace Plumbline.Core.Coherence;

/// <summary>A soft clause the optimum breaks; <see cref="Weight"/> is in clause-weight units (scaled weight / scale).</summary>
public sealed record FalsifiedClause(int Index, string Origin, IReadOnlyList<int> Literals, double Weight);
