using Plumbline.Reports.Model;

namespace Plumbline.Reports;

/// <summary>
/// A format that can be written while the run goes on: a head when it starts, one piece per claim as it finishes,
/// a summary at the end. Its <see cref="IReportWriter.WriteAsync"/> writes the same three parts from a finished report.
/// </summary>
public interface IStreamingReportWriter : IReportWriter
{
    Task BeginAsync(RunHeader header, Stream output, CancellationToken cancellationToken);

    Task ClaimAsync(ClaimReport claim, Stream output, CancellationToken cancellationToken);

    /// <summary>The summary; does not read <see cref="RunReport.Claims"/>.</summary>
    Task EndAsync(RunReport report, Stream output, CancellationToken cancellationToken);
}
