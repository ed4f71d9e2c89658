using Plumbline.Core.Runs;

namespace Plumbline.Reports;

/// <summary>Renders a finished run in one format. A writer sees only the result and where to write it.</summary>
public interface IReportWriter
{
    /// <summary>The format's name, as the registry and the command line know it ("text", "json", ...).</summary>
    string Format { get; }

    /// <summary>Writes the whole report to <paramref name="output"/>, which stays open.</summary>
    Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken);
}
