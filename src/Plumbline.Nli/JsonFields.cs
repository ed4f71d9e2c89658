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

        if (byIndex.Keys.Select((key, position) => key != position).Any(gap => gap))
        {
            throw Wrong(name, "numbered 0 to n-1 without gaps");
        }

        return byIndex.Values.ToArray();
    }

    public NliModelException Wrong(string name, string expected) =>
        new(file, $"field '{name}' must be {expected}");

    private JsonElement? Field(string name) =>
        root.TryGetProperty(name, out var value) && value.ValueKind != JsonValueKind.Null ? value : null;
}
