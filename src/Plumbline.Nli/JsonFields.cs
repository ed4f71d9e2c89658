using System.Globalization;
using System.Text.Json;

namespace Plumbline.Nli;

/// <summary>Typed reads of optional fields from a model description file; a wrong type names file and field.</summary>
internal sealed class JsonFields(string file, JsonElement root)
{
    public static JsonFields Parse(string file)
    {
        try
        {
            using var document = JsonDocument.Parse(System.IO.File.ReadAllBytes(file));
            if (document.RootElement.ValueKind != JsonValueKind.Object)
            {
                throw new NliModelException(file, "expected a JSON object");
            }

            return new JsonFields(file, document.RootElement.Clone());
        }
        catch (JsonException e)
        {
            throw new NliModelException(file, $"not valid JSON (line {e.LineNumber + 1}): {e.Message.Split('\n')[0]}", e);
        }
        catch (IOException e)
        {
            throw new NliModelException(file, $"cannot read: {e.Message}", e);
        }
    }

    public string File => file;

    public bool Has(string name) => root.TryGetProperty(name, out var value) && value.ValueKind != JsonValueKind.Null;

    public string? String(string name) =>
        Field(name) is { } value
            ? value.ValueKind == JsonValueKind.String ? value.GetString() : throw Wrong(name, "a string")
            : null;

    public bool? Bool(string name) =>
        Field(name) is { } value
            ? value.ValueKind is JsonValueKind.True or JsonValueKind.False ? value.GetBoolean() : throw Wrong(name, "true or false")
            : null;

    public long? Integer(string name) =>
        Field(name) is { } value
            ? value.ValueKind == JsonValueKind.Number && value.TryGetInt64(out var number) ? number : throw Wrong(name, "a whole number")
            : null;

    /// <summary>Any number, however large (configs write 1e30-sized sentinels where a whole number would overflow).</summary>
    public double? Number(string name) =>
        Field(name) is { } value
            ? value.ValueKind == JsonValueKind.Number ? value.GetDouble() : throw Wrong(name, "a number")
            : null;

    public IReadOnlyList<string>? Strings(string name)
    {
        if (Field(name) is not { } value)
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.Array || value.EnumerateArray().Any(item => item.ValueKind != JsonValueKind.String))
        {
            throw Wrong(name, "an array of strings");
        }

        return value.EnumerateArray().Select(item => item.GetString()!).ToArray();
    }

    /// <summary>An object of string values keyed by whole numbers 0..n-1 (as config.json id2label is), in key order.</summary>
    public IReadOnlyList<string>? IndexedStrings(string name)
    {
        if (Field(name) is not { } value)
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.Object)
        {
            throw Wrong(name, "an object mapping 0, 1, 2 to label names");
        }

        var byIndex = new SortedDictionary<int, string>();
        foreach (var property in value.EnumerateObject())
        {
            if (!int.TryParse(property.Name, NumberStyles.None, CultureInfo.InvariantCulture, out var index)
                || property.Value.ValueKind != JsonValueKind.String
                || !byIndex.TryAdd(index, property.Value.GetString()!))
            {
                throw Wrong(name, "an object mapping 0, 1, 2 to label names");
            }
        }

        return Consecutive(name, byIndex);
    }

    /// <summary>An object of whole-number values 0..n-1 keyed by name (as config.json label2id is), as the names in value order.</summary>
    public IReadOnlyList<string>? IndexedKeys(string name)
    {
        if (Field(name) is not { } value)
        {
            return null;
        }

        var byIndex = new SortedDictionary<int, string>();
        if (value.ValueKind != JsonValueKind.Object
            || value.EnumerateObject().Any(property => property.Value.ValueKind != JsonValueKind.Number
                || !property.Value.TryGetInt32(out var index) || !byIndex.TryAdd(index, property.Name)))
        {
            throw Wrong(name, "an object mapping label names to 0, 1, 2");
        }

        return Consecutive(name, byIndex);
    }

    public NliModelException Wrong(string name, string expected) =>
        new(file, $"field '{name}' must be {expected}");

    private IReadOnlyList<string> Consecutive(string name, SortedDictionary<int, string> byIndex) =>
        byIndex.Keys.Select((key, position) => key != position).Any(gap => gap)
            ? throw Wrong(name, "numbered 0 to n-1 without gaps")
            : byIndex.Values.ToArray();

    private JsonElement? Field(string name) =>
        root.TryGetProperty(name, out var value) && value.ValueKind != JsonValueKind.Null ? value : null;
}
