using Google.OrTools.Init;
using Google.OrTools.Sat;
using Plumbline.Core.MaxSat;

namespace Plumbline.Solver;

/// <summary>
/// Exact weighted partial MAX-SAT on OR-Tools CP-SAT. Each call builds its own model and solver, so one instance
/// can serve concurrent callers.
/// </summary>
public sealed class CpSatMaxSatSolver : IMaxSatSolver
{
    /// <summary>
    /// The largest total soft weight accepted. CP-SAT rejects an objective whose value range, offset included, could
    /// pass half the int64 range; a soft unit clause on a positive literal enters as w - w*x, counting twice, so a
    /// quarter of the range is what every mix of clauses is sure to fit in.
    /// </summary>
    public const long MaxSoftWeightSum = long.MaxValue / 4;
    private readonly CpSatOptions options;
    private readonly TimeProvider timeProvider;

    public CpSatMaxSatSolver(CpSatOptions? options = null, TimeProvider? timeProvider = null)
    {
        this.options = options ?? CpSatOptions.Default;
        this.options.Validate();
        this.timeProvider = timeProvider ?? TimeProvider.System;
    }

    public string Describe =>
        $"OR-Tools CP-SAT {OrToolsVersion.VersionString()}, {options.Workers} worker(s), "
        + (options.TimeLimit is { } limit ? $"time limit {limit.TotalSeconds:0.###} s" : "no time limit");

    /// <summary>Minimises the weight of falsified soft clauses subject to every hard clause.</summary>
    /// <exception cref="ArgumentException">The problem is malformed (see the message), including soft weights adding up to more than <see cref="MaxSoftWeightSum"/>.</exception>
    /// <exception cref="OperationCanceledException">The token was cancelled; a running search is stopped first.</exception>
    public Task<MaxSatSolution> SolveAsync(MaxSatProblem problem, CancellationToken cancellationToken)
    {
        ProblemChecks.SoftWeightSum(problem, MaxSoftWeightSum, "the most a CP-SAT objective can hold without risk of overflow");

        // CP-SAT blocks the calling thread for the whole search; keep it off the caller's thread.
        return Task.Run(() => Solve(problem, cancellationToken), cancellationToken);
    }

    private MaxSatSolution Solve(MaxSatProblem problem, CancellationToken cancellationToken)
    {
        var started = timeProvider.GetTimestamp();
        var model = new CpModel();
        var variables = new BoolVar[problem.VariableCount];
        for (var i = 0; i < variables.Length; i++)
        {
            variables[i] = model.NewBoolVar(string.Empty);
        }

        var objective = LinearExpr.NewBuilder();
        var literals = new List<ILiteral>();
        foreach (var clause in problem.Clauses)
        {
            literals.Clear();
            foreach (var literal in clause.Literals)
            {
                var variable = variables[Math.Abs(literal) - 1];
                literals.Add(literal > 0 ? variable : variable.Not());
            }

            if (clause.IsHard)
            {
                model.AddBoolOr(literals);
            }
            else if (clause.Weight == 0)
            {
                // Costs nothing either way; leaving it out keeps the model smaller.
            }
            else if (literals.Count == 0)
            {
                objective.Add(clause.Weight);
            }
            else if (literals.Count == 1)
            {
                // The negated literal is the violation indicator itself; no extra variable needed.
                objective.AddTerm(literals[0].Not(), clause.Weight);
            }
            else
            {
                var violated = model.NewBoolVar(string.Empty);
                literals.Add(violated);
                model.AddBoolOr(literals);
                objective.AddTerm(violated, clause.Weight);
            }
        }

        model.Minimize(objective);

        using var solver = new CpSolver { StringParameters = options.ToParameterString() };

        // Declared after the solver so it is disposed first: Dispose waits for a running StopSearch to return.
        using var registration = cancellationToken.Register(static state => ((CpSolver)state!).StopSearch(), solver);
        cancellationToken.ThrowIfCancellationRequested();
        var status = solver.Solve(model);
        cancellationToken.ThrowIfCancellationRequested();

        var solveStatus = status switch
        {
            CpSolverStatus.Optimal => SolveStatus.Optimal,
            CpSolverStatus.Feasible => SolveStatus.Feasible,
            CpSolverStatus.Infeasible => SolveStatus.Unsatisfiable,
            CpSolverStatus.Unknown => SolveStatus.Unknown,
            _ => throw new InvalidOperationException(
                $"CP-SAT rejected the model ({status}): {model.Validate()}"),
        };

        if (solveStatus is not (SolveStatus.Optimal or SolveStatus.Feasible))
        {
            return new MaxSatSolution(solveStatus, 0, [], [], timeProvider.GetElapsedTime(started));
        }

        var assignment = new bool[variables.Length];
        for (var i = 0; i < variables.Length; i++)
        {
            assignment[i] = solver.BooleanValue(variables[i]);
        }

        // Cost is recomputed from the assignment: with a time limit a violation indicator may be set although its
        // clause holds, and the assignment's own cost is the honest figure.
        var cost = problem.CostOf(assignment)
            ?? throw new InvalidOperationException("CP-SAT returned an assignment that breaks a hard clause.");
        var falsified = new List<int>();
        for (var index = 0; index < problem.Clauses.Count; index++)
        {
            var clause = problem.Clauses[index];
            if (!clause.IsHard && !clause.IsSatisfiedBy(assignment))
            {
                falsified.Add(index);
            }
        }

        return new MaxSatSolution(solveStatus, cost, assignment, falsified, timeProvider.GetElapsedTime(started));
    }
}
