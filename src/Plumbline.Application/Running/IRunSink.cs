namespace Plumbline.Application.Running;

/// <summary>
/// Receives a run's events one at a time, in order, from the run loop. A sink that throws is reported and left out
/// for the rest of the run; the run and the other sinks go on.
/// </summary>
public interface IRunSink
{
    /// <summary>What the sink does, for messages ("report json to out.json", "wcnf export").</summary>
    string Name { get; }

    Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken);

    Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken);

    /// <summary>Called once the run is over, with a token that is not the run's: an interrupted run still finishes its sinks.</summary>
    Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken);
}
