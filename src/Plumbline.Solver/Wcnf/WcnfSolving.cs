using Plumbline.Core.MaxSat;

namespace Plumbline.Solver.Wcnf;

/// <summary>Reads a WCNF file and solves it: the work behind solving a single file from the command line.</summary>
public static class WcnfSolving
{
    /// <exception cref="WcnfFormatException">The file breaks the format.</exception>
    /// <exception cref="IOException">The file cannot be read.</exception>
    /// <exception cref="ArgumentException">The instance cannot be handed to the solver (e.g. soft weights overflow).</exception>
    public static async Task<WcnfSolveSummary> SolveFileAsync(
        string path,
        IMaxSatSolver solver,
        CancellationToken cancellationToken)
    {
        var instance = await WcnfReader.ReadFileAsync(path, cancellationToken).ConfigureAwait(false);
        return await SolveAsync(instance, solver, cancellationToken).ConfigureAwait(false);
    }

    public static async Task<WcnfSolveSummary> SolveAsync(
        WcnfInstance instance,
        IMaxSatSolver solver,
        CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(instance);
        ArgumentNullException.ThrowIfNull(solver);
        var solution = await solver.SolveAsync(instance.Problem, cancellationToken).ConfigureAwait(false);
        return new WcnfSolveSummary(
            instance.Source,
            instance.Format,
            instance.Top,
            solution.Status,
            solution.HasAssignment ? solution.Cost : null,
            instance.Problem.VariableCount,
            instance.HardClauseCount,
            instance.SoftClauseCount,
            solution.WallTime,
            Explain(instance, solution.Status),
            solution);
    }

    internal static string? Explain(WcnfInstance instance, SolveStatus status) => status switch
    {
        SolveStatus.Optimal => null,
        SolveStatus.Feasible => "optimality not proven before the search stopped; the cost is the best found",
        SolveStatus.Unsatisfiable when instance.Top is { } top =>
            $"hard clauses are unsatisfiable (header top={top} makes every clause of weight >= {top} hard)",
        SolveStatus.Unsatisfiable => "hard clauses are unsatisfiable",
        SolveStatus.Unknown => "the search stopped before finding any assignment that satisfies the hard clauses",
        _ => throw new ArgumentOutOfRangeException(nameof(status), status, null),
    };
}
