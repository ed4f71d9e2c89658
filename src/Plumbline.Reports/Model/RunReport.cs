using Plumbline.Core.Runs;

namespace Plumbline.Reports.Model;

/// <summary>
/// A finished run as every report writer sees it. The claims are not a list in memory but a sequence a writer
/// reads (once or more), so a run of any size can be written without holding its verdicts.
/// </summary>
/// <param name="Header">Versions, settings, start.</param>
/// <param name="Finished">When the run ended.</param>
/// <param name="Figures">Run figures over the claims judged or failed.</param>
/// <param name="Gates">Gates checked on the figures (empty when none were set).</param>
/// <param name="Completion">Whether the run reached the end of its claims, and what went wrong on the way.</param>
/// <param name="Claims">One entry per claim, in input order.</param>
public sealed record RunReport(
    RunHeader Header,
    DateTimeOffset Finished,
    RunFigures Figures,
    IReadOnlyList<GateResult> Gates,
    RunCompletion Completion,
    IClaimReports Claims)
{
    /// <summary>True when every gate passed (or none was set).</summary>
    public bool GatesPassed => Gates.All(g => g.Passed);
}
