namespace Plumbline.Core.MaxSat;

/// <summary>Result of one solve. <see cref="Assignment"/> is indexed by variable - 1; empty unless a solution exists.</summary>
public sealed record MaxSatSolution(
    SolveStatus Status,
    long Cost,
    IReadOnlyList<bool> Assignment,
    IReadOnlyList<int> FalsifiedClauses,
    TimeSpan WallTime)
{
    public bool HasAssignment => Status is SolveStatus.Optimal or SolveStatus.Feasible;
}
