namespace Plumbline.Core.MaxSat;

public enum SolveStatus
{
    /// <summary>Proven optimal.</summary>
    Optimal,

    /// <summary>A solution was found but optimality was not proven (time limit).</summary>
    Feasible,

    /// <summary>The hard clauses cannot all hold.</summary>
    Unsatisfiable,

    /// <summary>The solver stopped without any solution.</summary>
    Unknown,
}
