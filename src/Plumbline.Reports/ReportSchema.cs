using Plumbline.Reports.Model;

namespace Plumbline.Reports;

/// <summary>Where the JSON Schema of the current report version lives, relative to the repository root.</summary>
public static class ReportSchema
{
    public const int Version = RunHeader.CurrentSchemaVersion;

    public const string Folder = "schemas";

    public static string FileName { get; } = $"plumbline-report-{Version}.schema.json";

    /// <summary>The schema of one JSON Lines record (run head, claim or summary) of the same version.</summary>
    public static string LinesFileName { get; } = $"plumbline-lines-{Version}.schema.json";

    /// <summary>The schema's <c>$id</c>; the reserved ".invalid" name keeps it from pointing anywhere real.</summary>
    public static Uri Id { get; } = new($"https://plumbline.invalid/schemas/{FileName}");
}
