using Plumbline.Core.MaxSat;
using Xunit;

namespace Plumbline.Solver.Tests;

internal static class SolutionAssert
{
    /// <summary>The reported cost and falsified clauses must be exactly what the returned assignment gives.</summary>
    public static void MatchesAssignment(MaxSatProblem problem, MaxSatSolution solution)
    {
        Assert.True(solution.HasAssignment, $"expected an assignment, status {solution.Status}");
        Assert.Equal(problem.VariableCount, solution.Assignment.Count);
        Assert.Equal(problem.CostOf(solution.Assignment), solution.Cost);

        var unsatisfiedSoft = Enumerable.Range(0, problem.Clauses.Count)
            .Where(i => !problem.Clauses[i].IsHard && !problem.Clauses[i].IsSatisfiedBy(solution.Assignment));
        Assert.Equal(unsatisfiedSoft, solution.FalsifiedClauses);
    }
}
