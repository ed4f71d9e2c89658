using System.Text.Json;

namespace Plumbline.Cli.Tests;

/// <summary>Reads what the tests need from a JSON run report.</summary>
internal static class ReportJson
{
    public static JsonElement Claim(JsonDocument report, string id) =>
        report.RootElement.GetProperty("claims").EnumerateArray().Single(c => c.GetProperty("id").GetString() == id);

    public static IReadOnlyList<string> Ids(JsonDocument report) =>
        [.. report.RootElement.GetProperty("claims").EnumerateArray().Select(c => c.GetProperty("id").GetString()!)];

    public static string Status(JsonDocument report, string id) => Claim(report, id).GetProperty("status").GetString()!;
}
