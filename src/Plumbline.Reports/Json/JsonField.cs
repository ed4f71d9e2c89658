using System.Globalization;
using System.Text.Json;

namespace Plumbline.Reports.Json;

/// <summary>A JSON value and the path that leads to it ("claims[3].statements[0].belief"), so a reader's error names the field.</summary>
internal readonly record struct JsonField(JsonElement Element, string Path, string File)
{
    public JsonField this[string name] => Element.ValueKind == JsonValueKind.Object && Element.TryGetProperty(name, out var value)
        ? new JsonField(value, Join(name), File)
        : throw Fail(Join(name), "missing");

    /// <summary>The property, or null when it is absent or JSON null.</summary>
    public JsonField? Optional(string name) =>
        Element.ValueKind == JsonValueKind.Object && Element.TryGetProperty(name, out var value) && value.ValueKind != JsonValueKind.Null
            ? new JsonField(value, Join(name), File)
            : null;

    public bool IsNull => Element.ValueKind == JsonValueKind.Null;

    public string String() => Element.ValueKind == JsonValueKind.String ? Element.GetString()! : throw Wrong("a string");

    public string? NullableString() => IsNull ? null : String();

    public bool Bool() => Element.ValueKind switch
    {
        JsonValueKind.True => true,
        JsonValueKind.False => false,
        _ => throw Wrong("true or false"),
    };

    public bool? NullableBool() => IsNull ? null : Bool();

    public double Number() => Element.ValueKind == JsonValueKind.Number ? Element.GetDouble() : throw Wrong("a number");

    public double? NullableNumber() => IsNull ? null : Number();

    public int Int() => Element.ValueKind == JsonValueKind.Number && Element.TryGetInt32(out var value) ? value : throw Wrong("a whole number");

    public int? NullableInt() => IsNull ? null : Int();

    public long Long() => Element.ValueKind == JsonValueKind.Number && Element.TryGetInt64(out var value) ? value : throw Wrong("a whole number");

    public DateTimeOffset Instant() =>
        DateTimeOffset.TryParse(String(), CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal, out var instant) ? instant : throw Wrong("a date and time");

    public TimeSpan Milliseconds() => TimeSpan.FromMilliseconds(Number());

    /// <summary>The items of an array, each with its index in the path.</summary>
    public IEnumerable<JsonField> Items()
    {
        if (Element.ValueKind != JsonValueKind.Array)
        {
            throw Wrong("an array");
        }

        var path = Path;
        var file = File;
        return Element.EnumerateArray().Select((item, i) => new JsonField(item, string.Create(CultureInfo.InvariantCulture, $"{path}[{i}]"), file));
    }

    /// <summary>The enum value whose report word is the string here.</summary>
    public T Word<T>(Func<T, string> wordOf)
        where T : struct, Enum
    {
        var word = String();
        foreach (var value in Enum.GetValues<T>())
        {
            if (WordOrNull(wordOf, value) == word)
            {
                return value;
            }
        }

        throw Fail(Path, $"unknown value '{word}'");
    }

    public ReportReadException Fail(string path, string problem) => new(File, path.Length == 0 ? problem : $"{path}: {problem}");

    private ReportReadException Wrong(string wanted) => Fail(Path, $"expected {wanted}, found {Describe(Element.ValueKind)}");

    private string Join(string name) => Path.Length == 0 ? name : $"{Path}.{name}";

    private static string? WordOrNull<T>(Func<T, string> wordOf, T value)
    {
        try
        {
            return wordOf(value);
        }
        catch (ArgumentOutOfRangeException)
        {
            // A value with no report word (a neutral link kind) is never written, so it is never read.
            return null;
        }
    }

    private static string Describe(JsonValueKind kind) => kind switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => "an array",
        JsonValueKind.String => "a string",
        JsonValueKind.Number => "a number",
        JsonValueKind.True or JsonValueKind.False => "true or false",
        JsonValueKind.Null => "null",
        _ => "nothing",
    };
}
