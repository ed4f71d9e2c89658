namespace Plumbline.Core.MaxSat;

/// <summary>
/// A disjunction of literals (DIMACS convention: variable v is +v, its negation -v, variables from 1).
/// A hard clause must hold; a soft one costs <see cref="Weight"/> when falsified.
/// </summary>
public sealed record WeightedClause(IReadOnlyList<int> Literals, long Weight, bool IsHard = false)
{
    public static WeightedClause Hard(params int[] literals) => new(literals, 0, IsHard: true);

    public static WeightedClause Soft(long weight, params int[] literals) => new(literals, weight);

    public bool IsSatisfiedBy(IReadOnlyList<bool> assignment)
    {
        foreach (var literal in Literals)
        {
            var value = assignment[Math.Abs(literal) - 1];
            if (literal > 0 == value)
            {
                return true;
            }
        }

        return false;
    }
}
