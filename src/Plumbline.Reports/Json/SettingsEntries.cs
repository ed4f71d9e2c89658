using System.Globalization;
using System.Text.Json;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Json;

/// <summary>
/// A run's settings as flat key/value pairs, spelled as the JSON report spells them ("model_source",
/// "tree_shape.levels[0].width", "rules.samples"), in the report's order. Two runs used the same settings when
/// their entries are equal; the keys that differ say how they differ.
/// </summary>
public static class SettingsEntries
{
    /// <summary>Keys that change how a report lists things, not what the run judged.</summary>
    public static IReadOnlySet<string> PresentationOnly { get; } = new HashSet<string>(StringComparer.Ordinal) { "pairs_listed" };

    public static IReadOnlyList<KeyValuePair<string, string>> Of(RunHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer))
        {
            json.WriteStartObject();
            ReportJson.WriteHead(json, header);
            json.WriteEndObject();
        }

        using var document = JsonDocument.Parse(buffer.ToArray());
        var entries = new List<KeyValuePair<string, string>>();
        Flatten(document.RootElement.GetProperty("settings"), "", entries);
        return entries;
    }

    /// <summary>The keys whose values differ between two runs (a key only one has counts), in the first run's order.</summary>
    public static IReadOnlyList<SettingDifference> Differences(RunHeader first, RunHeader second, bool judgingOnly = true)
    {
        var a = Of(first);
        var b = Of(second).ToDictionary(e => e.Key, e => e.Value, StringComparer.Ordinal);
        var differences = new List<SettingDifference>();
        foreach (var (key, value) in a)
        {
            var other = b.GetValueOrDefault(key);
            if (other != value && !(judgingOnly && PresentationOnly.Contains(key)))
            {
                differences.Add(new SettingDifference(key, value, other));
            }

            b.Remove(key);
        }

        differences.AddRange(b.Where(e => !(judgingOnly && PresentationOnly.Contains(e.Key))).Select(e => new SettingDifference(e.Key, null, e.Value)));
        return differences;
    }

    private static void Flatten(JsonElement element, string path, List<KeyValuePair<string, string>> entries)
    {
        switch (element.ValueKind)
        {
            case JsonValueKind.Object:
                foreach (var property in element.EnumerateObject())
                {
                    // The weight scale's explanation is the same sentence in every report.
                    if (property.Name != "meaning")
                    {
                        Flatten(property.Value, path.Length == 0 ? property.Name : $"{path}.{property.Name}", entries);
                    }
                }

                break;
            case JsonValueKind.Array:
                var i = 0;
                foreach (var item in element.EnumerateArray())
                {
                    Flatten(item, string.Create(CultureInfo.InvariantCulture, $"{path}[{i++}]"), entries);
                }

                if (i == 0)
                {
                    entries.Add(KeyValuePair.Create(path, "[]"));
                }

                break;
            case JsonValueKind.String:
                entries.Add(KeyValuePair.Create(path, element.GetString()!));
                break;
            default:
                entries.Add(KeyValuePair.Create(path, element.GetRawText()));
                break;
        }
    }
}
