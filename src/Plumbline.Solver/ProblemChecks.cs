using Plumbline.Core.MaxSat;

namespace Plumbline.Solver;

/// <summary>Shape checks shared by the solver and the writer, so both reject the same problems with the same words.</summary>
internal static class ProblemChecks
{
    /// <summary>Validates literals and weights and returns the sum of soft weights.</summary>
    /// <param name="problem">The problem to check.</param>
    /// <param name="maxSoftWeightSum">The largest total soft weight the caller can represent.</param>
    /// <param name="limitReason">Why that limit exists, for the error message.</param>
    /// <exception cref="ArgumentException">A literal is 0 or names a variable outside 1..VariableCount, a soft weight is negative, or the soft weights exceed the limit.</exception>
    public static long SoftWeightSum(MaxSatProblem problem, long maxSoftWeightSum, string limitReason)
    {
        ArgumentNullException.ThrowIfNull(problem);
        if (problem.VariableCount < 0)
        {
            throw new ArgumentException($"variable count {problem.VariableCount} is negative", nameof(problem));
        }

        long sum = 0;
        for (var index = 0; index < problem.Clauses.Count; index++)
        {
            var clause = problem.Clauses[index];
            foreach (var literal in clause.Literals)
            {
                if (literal == 0 || literal == int.MinValue || Math.Abs(literal) > problem.VariableCount)
                {
                    throw new ArgumentException(
                        $"clause {index}: literal {literal} is outside ±1..{problem.VariableCount}", nameof(problem));
                }
            }

            if (clause.IsHard)
            {
                continue;
            }

            if (clause.Weight < 0)
            {
                throw new ArgumentException($"clause {index}: soft weight {clause.Weight} is negative", nameof(problem));
            }

            if (clause.Weight > maxSoftWeightSum - sum)
            {
                throw new ArgumentException(
                    $"clause {index}: the soft weights add up to more than {maxSoftWeightSum}, {limitReason}",
                    nameof(problem));
            }

            sum += clause.Weight;
        }

        return sum;
    }
}
