using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>What a run ended with: the report the sinks got, every problem (the writers' own included) and a bug, if one stopped it.</summary>
/// <param name="Report">The run's report.</param>
/// <param name="Problems">Every problem of the run, those met while the reports were written included.</param>
/// <param name="Bug">An unexpected exception that stopped the run; null when none did.</param>
/// <param name="OutputClosed">Standard output was closed by its reader; the run stopped quietly.</param>
public sealed record RunOutcome(RunReport Report, IReadOnlyList<RunProblem> Problems, Exception? Bug, bool OutputClosed)
{
    /// <summary>The exit code, decided in one place (<see cref="ExitCodeDecision"/>).</summary>
    public int ExitCode => ExitCodeDecision.Of(this);
}
