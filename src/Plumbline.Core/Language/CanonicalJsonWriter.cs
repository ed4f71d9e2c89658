using System.Globalization;
using System.Text;

namespace Plumbline.Core.Language;

/// <summary>
/// The pieces of the canonical JSON that keys are hashed from. Strings escape only what JSON requires,
/// so the hashed bytes never depend on an encoder's notion of "safe" text, a culture or a runtime.
/// </summary>
public static class CanonicalJsonWriter
{
    /// <summary>Appends <c>"name":</c>, preceded by a comma unless it is the object's first field.</summary>
    public static void Field(StringBuilder json, string name, bool first = false)
    {
        ArgumentNullException.ThrowIfNull(json);
        if (!first)
        {
            json.Append(',');
        }

        Text(json, name);
        json.Append(':');
    }

    /// <summary>Appends a JSON string, escaping only the quote, the backslash and control characters.</summary>
    public static void Text(StringBuilder json, string value)
    {
        ArgumentNullException.ThrowIfNull(json);
        ArgumentNullException.ThrowIfNull(value);
        json.Append('"');
        foreach (var c in value)
        {
            switch (c)
            {
                case '"': json.Append("\\\""); break;
                case '\\': json.Append("\\\\"); break;
                case '\b': json.Append("\\b"); break;
                case '\f': json.Append("\\f"); break;
                case '\n': json.Append("\\n"); break;
                case '\r': json.Append("\\r"); break;
                case '\t': json.Append("\\t"); break;
                default:
                    if (c < 0x20)
                    {
                        json.Append("\\u").Append(((int)c).ToString("x4", CultureInfo.InvariantCulture));
                    }
                    else
                    {
                        json.Append(c);
                    }

                    break;
            }
        }

        json.Append('"');
    }
}
