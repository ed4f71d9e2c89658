using System.Globalization;
using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Sinks;

/// <summary>
/// Tells a person on standard error what went wrong, one line each: bad input lines, failed claims (as they are
/// handed on), failing sinks, why the run stopped, and an unexpected error, with its stack trace when debugging.
/// </summary>
public sealed class DiagnosticsSink(TextWriter error, bool debug) : IRunSink, IRunDiagnostics
{
    public string Name => "diagnostics";

    /// <summary>The input's bad lines, before the run starts.</summary>
    public void InputProblems(IEnumerable<ClaimFileException> problems)
    {
        ArgumentNullException.ThrowIfNull(problems);
        foreach (var problem in problems)
        {
            Write(problem.Message);
        }
    }

    public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken) => Task.CompletedTask;

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken)
    {
        if (ready.Report.Error is { } reason)
        {
            Write(reason);
        }

        return Task.CompletedTask;
    }

    public Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken)
    {
        var completion = finished.Report.Completion;
        if (completion.StoppedBecause is { } reason && reason != OutputClosedException.Reason)
        {
            Write(string.Create(CultureInfo.InvariantCulture,
                $"{reason}; {finished.Report.Figures.Claims} claim(s) finished, {completion.NotJudged.Count} not judged"));
        }

        return Task.CompletedTask;
    }

    public void Problem(RunProblem problem, Exception? exception)
    {
        ArgumentNullException.ThrowIfNull(problem);
        Write(problem.Message);
        if (debug && exception is not null)
        {
            error.WriteLine(exception.ToString());
        }
    }

    /// <summary>An unexpected exception: a bug. Its stack trace is shown with the debug option.</summary>
    public void Bug(Exception exception)
    {
        ArgumentNullException.ThrowIfNull(exception);
        Write($"internal error: {exception.GetType().Name}: {exception.Message}" + (debug ? "" : " (run with --debug for the stack trace)"));
        if (debug)
        {
            error.WriteLine(exception.ToString());
        }
    }

    private void Write(string message) => error.WriteLine(DiagnosticText.Line(message));
}
