namespace Plumbline.Core.MaxSat;

/// <summary>A weighted (partial) MAX-SAT instance with integer weights; minimise the weight of falsified soft clauses.</summary>
public sealed record MaxSatProblem(int VariableCount, IReadOnlyList<WeightedClause> Clauses)
{
    /// <summary>The same problem with extra hard clauses (used to pin a variable for the margin).</summary>
    public MaxSatProblem With(params WeightedClause[] extra) => this with { Clauses = [.. Clauses, .. extra] };

    /// <summary>Cost of an assignment, or null when it breaks a hard clause.</summary>
    public long? CostOf(IReadOnlyList<bool> assignment)
    {
        long cost = 0;
        foreach (var clause in Clauses)
        {
            if (clause.IsSatisfiedBy(assignment))
            {
                continue;
            }

            if (clause.IsHard)
            {
                return null;
            }

            cost += clause.Weight;
        }

        return cost;
    }
}
