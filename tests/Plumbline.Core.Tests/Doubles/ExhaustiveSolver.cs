using System.Diagnostics;
using Plumbline.Core.MaxSat;

namespace Plumbline.Core.Tests.Doubles;

/// <summary>Tries every assignment (small problems only); the first cheapest one in counting order wins.</summary>
internal sealed class ExhaustiveSolver : IMaxSatSolver
{
    public List<MaxSatProblem> Problems { get; } = [];

    public string Describe => "exhaustive";

    public Task<MaxSatSolution> SolveAsync(MaxSatProblem problem, CancellationToken cancellationToken)
    {
        Problems.Add(problem);
        var watch = Stopwatch.StartNew();
        long? bestCost = null;
        bool[]? best = null;
        for (long bits = 0; bits < 1L << problem.VariableCount; bits++)
        {
            var assignment = new bool[problem.VariableCount];
            for (var v = 0; v < assignment.Length; v++)
            {
                assignment[v] = (bits >> v & 1) == 1;
            }

            if (problem.CostOf(assignment) is { } cost && (bestCost is null || cost < bestCost))
            {
                (bestCost, best) = (cost, assignment);
            }
        }

        var solution = best is null
            ? new MaxSatSolution(SolveStatus.Unsatisfiable, 0, [], [], watch.Elapsed)
            : new MaxSatSolution(
                SolveStatus.Optimal,
                bestCost!.Value,
                best,
                [.. Enumerable.Range(0, problem.Clauses.Count).Where(i => !problem.Clauses[i].IsSatisfiedBy(best))],
                watch.Elapsed);
        return Task.FromResult(solution);
    }
}
