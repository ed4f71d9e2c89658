using Plumbline.Reports.Model;

namespace Plumbline.Reports;

/// <summary>Renders a finished run in one format. A writer sees only the report and where to write it.</summary>
public interface IReportWriter
{
    /// <summary>The format's name, as the registry and the command line know it ("text", "json", ...).</summary>
    string Format { get; }

    /// <summary>Writes the whole report to <paramref name="output"/>, which stays open. May read the claims more than once.</summary>
    Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken);
}
