using System.Diagnostics;
using Plumbline.Core.MaxSat;

namespace Plumbline.Benchmarks.Trees;

/// <summary>
/// An exact weighted MAX-SAT solver for the small problems of one claim (at most a few dozen variables):
/// depth-first over the variables in order, each clause judged as soon as its highest variable is set,
/// a branch cut once its broken weight reaches the best complete assignment found. It lets a settings grid
/// re-solve thousands of trees in seconds; the grid checks it against CP-SAT on request (--check-solver).
/// </summary>
internal sealed class ExactSmallSolver : IMaxSatSolver
{
    public string Describe => "exact depth-first search (benchmark)";

    public Task<MaxSatSolution> SolveAsync(MaxSatProblem problem, CancellationToken cancellationToken)
    {
        var watch = Stopwatch.StartNew();
        var n = problem.VariableCount;
        var closing = new List<int>[n + 1];
        for (var v = 0; v <= n; v++)
        {
            closing[v] = [];
        }

        for (var i = 0; i < problem.Clauses.Count; i++)
        {
            closing[problem.Clauses[i].Literals.Max(Math.Abs)].Add(i);
        }

        var assignment = new bool[n];
        bool[]? best = null;
        var bestCost = long.MaxValue;

        void Search(int variable, long cost)
        {
            if (variable == n)
            {
                (best, bestCost) = ((bool[])assignment.Clone(), cost);
                return;
            }

            foreach (var value in (ReadOnlySpan<bool>)[false, true])
            {
                assignment[variable] = value;
                var total = cost;
                var feasible = true;
                foreach (var index in closing[variable + 1])
                {
                    var clause = problem.Clauses[index];
                    if (!clause.IsSatisfiedBy(assignment))
                    {
                        feasible &= !clause.IsHard;
                        total += clause.Weight;
                    }
                }

                if (feasible && total < bestCost)
                {
                    Search(variable + 1, total);
                }
            }
        }

        Search(0, 0);
        var solution = best is null
            ? new MaxSatSolution(SolveStatus.Unsatisfiable, 0, [], [], watch.Elapsed)
            : new MaxSatSolution(
                SolveStatus.Optimal,
                bestCost,
                best,
                [.. Enumerable.Range(0, problem.Clauses.Count).Where(i => !problem.Clauses[i].IsSatisfiedBy(best))],
                watch.Elapsed);
        return Task.FromResult(solution);
    }
}
