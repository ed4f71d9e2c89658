using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>
/// Hands each event to every sink in turn and keeps them apart: a sink that throws is reported through the
/// diagnostics, recorded as a problem of the run and skipped from then on, and never stops the others.
/// </summary>
public sealed class SinkSet(IReadOnlyList<IRunSink> sinks, IRunDiagnostics diagnostics)
{
    private readonly HashSet<IRunSink> dropped = [];
    private readonly List<RunProblem> problems = [];

    /// <summary>Problems the sinks met so far.</summary>
    public IReadOnlyList<RunProblem> Problems => problems;

    /// <summary>A sink found standard output closed; nobody reads the results any more.</summary>
    public bool OutputClosed { get; private set; }

    public Task StartedAsync(RunStarted started, CancellationToken cancellationToken) =>
        EachAsync(sink => sink.RunStartedAsync(started, cancellationToken));

    public Task ReadyAsync(VerdictReady ready, CancellationToken cancellationToken) =>
        EachAsync(sink => sink.VerdictReadyAsync(ready, cancellationToken));

    public Task FinishedAsync(RunFinished finished, CancellationToken cancellationToken) =>
        EachAsync(sink => sink.RunFinishedAsync(finished, cancellationToken));

    private async Task EachAsync(Func<IRunSink, Task> call)
    {
        foreach (var sink in sinks)
        {
            if (dropped.Contains(sink))
            {
                continue;
            }

            try
            {
                await call(sink);
            }
            catch (OutputClosedException)
            {
                dropped.Add(sink);
                OutputClosed = true;
            }
            catch (OperationCanceledException)
            {
                // The run's own cancellation reached a sink mid-write; the run loop reports the interruption.
                throw;
            }
            catch (Exception e)
            {
                dropped.Add(sink);
                var problem = new RunProblem(sink.Name, $"{sink.Name} failed: {e.Message}");
                problems.Add(problem);
                diagnostics.Problem(problem, e);
            }
        }
    }
}
