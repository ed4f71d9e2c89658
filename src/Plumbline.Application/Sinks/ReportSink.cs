using Plumbline.Application.Running;
using Plumbline.Reports;

namespace Plumbline.Application.Sinks;

/// <summary>Writes one report format once the run is over, reading the claims back from the run's store.</summary>
public sealed class ReportSink(IReportWriter writer, ReportDestination destination) : IRunSink
{
    public string Name => $"report {writer.Format} to {destination.Description}";

    public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken) => Task.CompletedTask;

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken) => Task.CompletedTask;

    public async Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken)
    {
        var output = destination.Open();
        try
        {
            await writer.WriteAsync(finished.Report, output, cancellationToken);
            await output.FlushAsync(cancellationToken);
        }
        finally
        {
            if (destination.OwnsStream)
            {
                await output.DisposeAsync();
            }
        }
    }
}
