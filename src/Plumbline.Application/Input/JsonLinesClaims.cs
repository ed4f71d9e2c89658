using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text.Json;
using Plumbline.Core.Claims;

namespace Plumbline.Application.Input;

/// <summary>
/// Claims as JSON Lines: one object per line, <c>{"id": "...", "claim": "...", "gold": true|false|null|"yes"..., "tags": ["..."]}</c>.
/// Only <c>claim</c> is required; a missing id is the line number. Blank lines are skipped. Each bad line becomes
/// a problem naming its field, and reading goes on.
/// </summary>
internal static class JsonLinesClaims
{
    private static readonly string[] KnownFields = ["id", "claim", "gold", "tags"];

    public static async IAsyncEnumerable<ClaimLine> ReadAsync(
        TextReader reader,
        string source,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        await foreach (var (lineNumber, line, tooLong) in InputLines.ReadAsync(reader, source, cancellationToken))
        {
            if (tooLong is not null)
            {
                yield return ClaimLine.Bad(tooLong);
                continue;
            }

            ClaimLine parsed;
            try
            {
                parsed = ClaimLine.Good(lineNumber, Parse(line, source, lineNumber));
            }
            catch (ClaimFileException problem)
            {
                parsed = ClaimLine.Bad(problem);
            }

            yield return parsed;
        }
    }

    internal static string LineId(int lineNumber) => lineNumber.ToString(CultureInfo.InvariantCulture);

    private static Claim Parse(string line, string source, int lineNumber)
    {
        ClaimFileException Error(string? field, string problem) => new(source, lineNumber, field, problem);

        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(line);
        }
        catch (JsonException e)
        {
            throw Error(null, $"invalid JSON at byte {e.BytePositionInLine + 1} of the line");
        }

        using (document)
        {
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object)
            {
                throw Error(null, $"expected a JSON object, found {Describe(root.ValueKind)}");
            }

            string? id = null, text = null;
            bool? gold = null;
            List<string>? tags = null;
            var present = new HashSet<string>(StringComparer.Ordinal);
            foreach (var property in root.EnumerateObject())
            {
                var name = property.Name;
                if (!present.Add(name))
                {
                    throw Error(name, "given twice");
                }

                var value = property.Value;
                switch (name)
                {
                    case "id":
                        id = value.ValueKind == JsonValueKind.String && !string.IsNullOrWhiteSpace(value.GetString())
                            ? value.GetString()!.Trim()
                            : throw Error(name, value.ValueKind == JsonValueKind.String
                                ? "empty"
                                : $"expected a string, found {Describe(value.ValueKind)}");
                        break;
                    case "claim":
                        text = value.ValueKind == JsonValueKind.String && !string.IsNullOrWhiteSpace(value.GetString())
                            ? value.GetString()!.Trim()
                            : throw Error(name, "missing or empty");
                        break;
                    case "gold":
                        gold = value.ValueKind switch
                        {
                            JsonValueKind.True => true,
                            JsonValueKind.False => false,
                            JsonValueKind.Null => null,
                            JsonValueKind.String => GoldLabels.TryParse(value.GetString()!, out var label)
                                ? label
                                : throw Error(name, GoldLabels.Unknown(value.GetString()!)),
                            _ => throw Error(name, $"expected true, false or null, found {Describe(value.ValueKind)}"),
                        };
                        break;
                    case "tags":
                        tags = ParseTags(value, Error);
                        break;
                    default:
                        throw Error(name, $"unknown field (known: {string.Join(", ", KnownFields)})");
                }
            }

            if (text is null)
            {
                throw Error("claim", "missing or empty");
            }

            return new Claim(id ?? LineId(lineNumber), text, gold, tags);
        }
    }

    private static List<string>? ParseTags(JsonElement value, Func<string?, string, ClaimFileException> error)
    {
        if (value.ValueKind == JsonValueKind.Null)
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.Array)
        {
            throw error("tags", $"expected an array of strings, found {Describe(value.ValueKind)}");
        }

        var tags = new List<string>();
        var index = 0;
        foreach (var item in value.EnumerateArray())
        {
            if (item.ValueKind != JsonValueKind.String)
            {
                throw error($"tags[{index}]", $"expected a string, found {Describe(item.ValueKind)}");
            }

            tags.Add(item.GetString()!);
            index++;
        }

        return tags;
    }

    private static string Describe(JsonValueKind kind) => kind switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => "an array",
        JsonValueKind.String => "a string",
        JsonValueKind.Number => "a number",
        JsonValueKind.True or JsonValueKind.False => "a boolean",
        JsonValueKind.Null => "null",
        _ => kind.ToString(),
    };
}
