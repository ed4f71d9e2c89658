using Plumbline.Application.Running;
using Plumbline.Reports;

namespace Plumbline.Application.Sinks;

/// <summary>Writes a streaming format as the run goes: the head at the start, each claim as it is handed on, the summary at the end.</summary>
public sealed class StreamingReportSink(IStreamingReportWriter writer, ReportDestination destination) : IRunSink, IAsyncDisposable
{
    private Stream? output;

    public string Name => $"report {writer.Format} to {destination.Description}";

    public async Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken)
    {
        output = destination.Open();
        await writer.BeginAsync(started.Header, output, cancellationToken);
        await output.FlushAsync(cancellationToken);
    }

    public async Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken)
    {
        var stream = output ?? throw new InvalidOperationException("the run has not started");
        await writer.ClaimAsync(ready.Report, stream, cancellationToken);
        // A reader of the stream (a CI log, a pipe) sees each claim when it is done.
        await stream.FlushAsync(cancellationToken);
    }

    public async Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken)
    {
        var stream = output ?? throw new InvalidOperationException("the run has not started");
        await writer.EndAsync(finished.Report, stream, cancellationToken);
        await stream.FlushAsync(cancellationToken);
        await DisposeAsync();
    }

    public async ValueTask DisposeAsync()
    {
        if (output is not null && destination.OwnsStream)
        {
            await output.DisposeAsync();
        }

        output = null;
    }
}
