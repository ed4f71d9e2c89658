namespace Plumbline.Application.Running;

/// <summary>
/// The one place a judging run's exit code is decided. An incomplete run (3) outranks a failed gate (1): gates
/// checked on part of the claims say little, and a CI job must see that the run itself did not finish.
/// </summary>
public static class ExitCodeDecision
{
    public static int Of(RunOutcome outcome)
    {
        ArgumentNullException.ThrowIfNull(outcome);
        var report = outcome.Report;
        var incomplete = outcome.Bug is not null
            || outcome.OutputClosed
            || report.Completion.StoppedBecause is not null
            || report.Completion.NotJudged.Count > 0
            || outcome.Problems.Count > 0
            || report.Figures.Failed > 0;
        if (incomplete)
        {
            return ExitCodes.Incomplete;
        }

        return report.GatesPassed ? ExitCodes.Success : ExitCodes.GateFailed;
    }
}
