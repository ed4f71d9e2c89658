namespace Plumbline.Application;

/// <summary>The process exit codes, a contract with scripts and CI.</summary>
public static class ExitCodes
{
    /// <summary>Everything judged and every gate passed; for <c>solve</c>: the optimum was found and proven.</summary>
    public const int Success = 0;

    /// <summary>A gate failed; for <c>solve</c>: the hard clauses cannot all hold, so the instance has no solution.</summary>
    public const int GateFailed = 1;

    /// <summary>Usage or configuration error, found before anything was spent.</summary>
    public const int UsageError = 2;

    /// <summary>The run is incomplete: some claims failed, bad input lines were skipped, a report or export
    /// failed, the run was interrupted or halted, or (for <c>solve</c>) the search stopped before proving an optimum.</summary>
    public const int Incomplete = 3;
}
