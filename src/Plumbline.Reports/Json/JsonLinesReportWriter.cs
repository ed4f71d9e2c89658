using System.Text.Encodings.Web;
using System.Text.Json;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Json;

/// <summary>
/// JSON Lines, written as the run goes: a "run" record (versions, settings, start), one "claim" record per claim as
/// it finishes (the same object as in the JSON report), then one "summary" record (figures, gates, completion).
/// Each record is one line; schemas/plumbline-lines-2.schema.json describes them.
/// </summary>
internal sealed class JsonLinesReportWriter : IStreamingReportWriter
{
    public const string FormatName = "jsonl";

    private static readonly JsonWriterOptions LineOptions = new() { Indented = false, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    public string Format => FormatName;

    public async Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(report);
        await BeginAsync(report.Header, output, cancellationToken);
        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            await ClaimAsync(claim, output, cancellationToken);
        }

        await EndAsync(report, output, cancellationToken);
    }

    public Task BeginAsync(RunHeader header, Stream output, CancellationToken cancellationToken) =>
        LineAsync(output, "run", json => ReportJson.WriteHead(json, header), cancellationToken);

    public Task ClaimAsync(ClaimReport claim, Stream output, CancellationToken cancellationToken) =>
        LineAsync(output, "claim", json => ReportJson.WriteClaimBody(json, claim), cancellationToken);

    public Task EndAsync(RunReport report, Stream output, CancellationToken cancellationToken) =>
        LineAsync(output, "summary", json => ReportJson.WriteSummary(json, report), cancellationToken);

    private static async Task LineAsync(Stream output, string record, Action<Utf8JsonWriter> body, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(output);
        using var buffer = new MemoryStream();
        await using (var json = new Utf8JsonWriter(buffer, LineOptions))
        {
            json.WriteStartObject();
            json.WriteString("record", record);
            body(json);
            json.WriteEndObject();
        }

        buffer.WriteByte((byte)'\n');
        await output.WriteAsync(buffer.GetBuffer().AsMemory(0, (int)buffer.Length), cancellationToken);
    }
}
