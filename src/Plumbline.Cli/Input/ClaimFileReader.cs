using System.Runtime.CompilerServices;
using System.Text;
using System.Text.Json;
using Plumbline.Core.Claims;

namespace Plumbline.Cli.Input;

/// <summary>
/// Reads a claim file lazily, so that claims can be judged while the rest of the file is still unread.
/// A <c>.txt</c> file holds one claim per line (its id is the line number); any other file is JSON Lines,
/// one object per line: <c>{"id": "...", "claim": "...", "gold": true|false, "tags": ["..."]}</c>, where
/// only <c>claim</c> is required and a missing id is the line number. Blank lines are skipped in both.
/// Every problem is a <see cref="ClaimFileException"/> naming file, line and field, thrown when its line
/// is reached.
/// </summary>
internal static class ClaimFileReader
{
    private static readonly string[] KnownFields = ["id", "claim", "gold", "tags"];

    public static bool IsPlainText(string path) =>
        string.Equals(Path.GetExtension(path), ".txt", StringComparison.OrdinalIgnoreCase);

    /// <summary>Opens <paramref name="path"/> and yields its claims as they are read.</summary>
    /// <exception cref="FileNotFoundException">The file does not exist (thrown on the first read).</exception>
    public static async IAsyncEnumerable<Claim> ReadFileAsync(
        string path,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        using var reader = new StreamReader(path, Encoding.UTF8, detectEncodingFromByteOrderMarks: true);
        await foreach (var claim in ReadAsync(reader, path, IsPlainText(path), cancellationToken))
        {
            yield return claim;
        }
    }

    /// <param name="reader">The file's text.</param>
    /// <param name="source">The file name used in error messages.</param>
    /// <param name="plainText">True for one claim per line, false for JSON Lines.</param>
    public static async IAsyncEnumerable<Claim> ReadAsync(
        TextReader reader,
        string source,
        bool plainText,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(reader);
        var seen = new Dictionary<string, int>(StringComparer.Ordinal);
        var lineNumber = 0;
        while (await reader.ReadLineAsync(cancellationToken) is { } line)
        {
            lineNumber++;
            if (string.IsNullOrWhiteSpace(line))
            {
                continue;
            }

            var claim = plainText
                ? new Claim(Id(lineNumber), line.Trim())
                : ParseJsonLine(line, source, lineNumber);
            if (!seen.TryAdd(claim.Id, lineNumber))
            {
                throw new ClaimFileException(source, lineNumber, "id", $"duplicate id '{claim.Id}' (first used on line {seen[claim.Id]})");
            }

            yield return claim;
        }

        if (seen.Count == 0)
        {
            throw new ClaimFileException(source, Math.Max(lineNumber, 1), null, "the file holds no claim");
        }
    }

    private static string Id(int lineNumber) => lineNumber.ToString(System.Globalization.CultureInfo.InvariantCulture);

    private static Claim ParseJsonLine(string line, string source, int lineNumber)
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

            return new Claim(id ?? Id(lineNumber), text, gold, tags);
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
