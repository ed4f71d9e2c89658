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

    public static void WriteNullable(this Utf8JsonWriter json, string name, long? value)
    {
        if (value is { } number)
        {
            json.WriteNumber(name, number);
        }
        else
        {
            json.WriteNull(name);
        }
    }
}
