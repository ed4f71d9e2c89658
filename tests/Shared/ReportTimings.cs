using System.Text.Json.Nodes;

namespace Plumbline.Tests;

/// <summary>Drops the fields of a JSON report that differ between two runs of the same claims: start, end, wall time and each claim's timings.</summary>
internal static class ReportTimings
{
    public static string Without(string json)
    {
        var root = JsonNode.Parse(json)!.AsObject();
        root.Remove("started");
        root.Remove("finished");
        root["figures"]!.AsObject().Remove("wall_time_ms");
        foreach (var claim in root["claims"]!.AsArray())
        {
            claim!.AsObject().Remove("timings_ms");
        }

        return root.ToJsonString();
    }
}
