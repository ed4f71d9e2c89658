using Plumbline.Core.MaxSat;

namespace Plumbline.Solver.Wcnf;

/// <summary>What solving one WCNF file gave.</summary>
/// <param name="Cost">Cost of the returned assignment (the optimum when <see cref="Status"/> is Optimal); null without one.</param>
/// <param name="Message">A one-line explanation when the status is not Optimal; null otherwise.</param>
/// <param name="Solution">The full solution, for callers that want the assignment or the falsified clauses.</param>
public sealed record WcnfSolveSummary(
    string File,
    WcnfFormat Format,
    long? Top,
    SolveStatus Status,
    long? Cost,
    int Variables,
    int HardClauses,
    int SoftClauses,
    TimeSpan WallTime,
    string? Message,
    MaxSatSolution Solution);
