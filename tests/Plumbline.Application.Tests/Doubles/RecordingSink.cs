using Plumbline.Application.Running;

namespace Plumbline.Application.Tests.Doubles;

/// <summary>Keeps what it is given; can be told to throw on a given event.</summary>
internal sealed class RecordingSink(string name = "recording") : IRunSink
{
    public List<string> Events { get; } = [];

    public List<string> Claims { get; } = [];

    public RunFinished? Finished { get; private set; }

    /// <summary>Thrown on the n-th verdict (1-based); 0 never.</summary>
    public int ThrowOnVerdict { get; init; }

    public Exception ToThrow { get; init; } = new InvalidDataException("disk full");

    public Action<VerdictReady>? OnVerdict { get; init; }

    public string Name => name;

    public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken)
    {
        Events.Add($"started {started.ExpectedClaims}");
        return Task.CompletedTask;
    }

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken)
    {
        Events.Add($"verdict {ready.Report.Id}");
        Claims.Add(ready.Report.Id);
        OnVerdict?.Invoke(ready);
        if (ThrowOnVerdict == ready.Position)
        {
            throw ToThrow;
        }

        return Task.CompletedTask;
    }

    public Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken)
    {
        Events.Add("finished");
        Finished = finished;
        return Task.CompletedTask;
    }
}
