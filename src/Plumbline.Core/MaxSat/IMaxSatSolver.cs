namespace Plumbline.Core.MaxSat;

/// <summary>Port to an exact weighted MAX-SAT solver.</summary>
public interface IMaxSatSolver
{
    string Describe { get; }

    Task<MaxSatSolution> SolveAsync(MaxSatProblem problem, CancellationToken cancellationToken);
}
