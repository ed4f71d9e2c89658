using System.Text;
using System.Text.Json;

namespace Plumbline.Cli.Commands;

/// <summary>Small JSON results of the commands that do not write a run report.</summary>
internal static class JsonText
{
    /// <summary>One indented JSON object and a final line break.</summary>
    public static string Object(Action<Utf8JsonWriter> body)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, new JsonWriterOptions { Indented = true }))
        {
            json.WriteStartObject();
            body(json);
            json.WriteEndObject();
        }

        return Encoding.UTF8.GetString(buffer.ToArray()) + "\n";
    }

    /// <summary>A property whose value may be null (numbers, strings): null is written as JSON null.</summary>
    public static void WriteNullable<T>(this Utf8JsonWriter json, string name, T value)
    {
        json.WritePropertyName(name);
        JsonSerializer.Serialize(json, value);
    }
}
