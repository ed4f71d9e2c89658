using Plumbline.Core.Runs;
using Plumbline.Reports.Comparison;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>
/// The one place the exit code of a judging run (and of a merge of shard reports) is decided. An incomplete run (3)
/// outranks a failed gate (1): gates checked on part of the claims say little, and a CI job must see that the run
/// itself did not finish. Failed claims make a run incomplete, unless the run set a <c>max_failed</c> gate: then
/// that gate decides about them (a few failed claims within the limit pass; more fail the gate, exit 1), while an
/// interruption, a halted budget, unread claims or a failing report still make the run incomplete. A comparison of
/// two runs exits with 1 when its regression gate fails, else 0.
/// </summary>
public static class ExitCodeDecision
{
    public static int Of(RunOutcome outcome)
    {
        ArgumentNullException.ThrowIfNull(outcome);
        return Of(outcome.Report, outcome.Bug is not null || outcome.OutputClosed || outcome.Problems.Count > 0);
    }

    /// <summary>The exit code of a finished report; <paramref name="incompleteAnyway"/> adds what the report itself does not show.</summary>
    public static int Of(RunReport report, bool incompleteAnyway = false)
    {
        ArgumentNullException.ThrowIfNull(report);
        var failedClaimsGated = report.Gates.Any(g => g.Name == Gate.NameOf(GateFigure.FailedClaims));
        var incomplete = incompleteAnyway
            || report.Completion.StoppedBecause is not null
            || report.Completion.NotJudged.Count > 0
            || report.Completion.Problems.Count > 0
            || (report.Figures.Failed > 0 && !failedClaimsGated);
        if (incomplete)
        {
            return ExitCodes.Incomplete;
        }

        return report.GatesPassed ? ExitCodes.Success : ExitCodes.GateFailed;
    }

    /// <summary>The exit code of <c>plumb compare</c>.</summary>
    public static int Of(ComparisonReport comparison)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        return comparison.Gate is { Passed: false } ? ExitCodes.GateFailed : ExitCodes.Success;
    }
}
