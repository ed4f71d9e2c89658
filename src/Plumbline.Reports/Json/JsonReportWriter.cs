using System.Text.Encodings.Web;
using System.Text.Json;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Json;

/// <summary>The whole run as one JSON document, shaped as schemas/plumbline-report-2.schema.json describes.</summary>
internal sealed class JsonReportWriter : IReportWriter
{
    public const string FormatName = "json";

    /// <summary>
    /// Indented with "\n" on every platform, and non-ASCII text left readable: the file is for people
    /// and diff tools as much as for programs, and is never embedded in HTML unescaped.
    /// </summary>
    internal static JsonWriterOptions Options { get; } = new()
    {
        Indented = true,
        IndentSize = 2,
        NewLine = "\n",
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    public string Format => FormatName;

    public async Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(output);
        await using var json = new Utf8JsonWriter(output, Options);
        json.WriteStartObject();
        ReportJson.WriteHead(json, report.Header);
        ReportJson.WriteSummary(json, report);
        json.WriteStartArray("claims");
        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            json.WriteStartObject();
            ReportJson.WriteClaimBody(json, claim);
            json.WriteEndObject();
            // A sweep's report can be large; hand each claim to the stream instead of buffering the run.
            await json.FlushAsync(cancellationToken);
        }

        json.WriteEndArray();
        json.WriteEndObject();
        await json.FlushAsync(cancellationToken);
        await output.WriteAsync("\n"u8.ToArray(), cancellationToken);
        await output.FlushAsync(cancellationToken);
    }
}
