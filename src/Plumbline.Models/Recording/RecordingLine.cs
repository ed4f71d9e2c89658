using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>Writes the lines of a recording; the reader compares responses in this same spelling.</summary>
internal static class RecordingLine
{
    // Responses are for people to read, so non-ASCII text stays as it is; the request part is the
    // canonical JSON verbatim, so a reader can see exactly what was hashed.
    private static readonly JsonWriterOptions Options = new() { Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    public static string Format(RequestFingerprint fingerprint, string responseJson) =>
        Format(fingerprint.Key, fingerprint.CanonicalJson, responseJson);

    /// <summary>A line from a stored key, canonical request and response, as the response cache keeps them.</summary>
    public static string Format(string key, string canonicalRequest, string responseJson) =>
        $"{{\"key\":\"{key}\",\"request\":{canonicalRequest},\"response\":{responseJson}}}";

    public static string Response(GenerationResult result) => Write(json =>
    {
        json.WriteStartArray("texts");
        foreach (var text in result.Texts)
        {
            json.WriteStringValue(text);
        }

        json.WriteEndArray();
        WriteUsage(json, result.Usage);
    });

    public static string Response(AnswerProbabilities answer) => Write(json =>
    {
        json.WritePropertyName("p_true");
        json.WriteRawValue(RequestFingerprint.FormatReal(answer.True));
        json.WritePropertyName("p_false");
        json.WriteRawValue(RequestFingerprint.FormatReal(answer.False));
        if (answer.Estimated)
        {
            json.WriteBoolean("estimated", true);
        }

        WriteUsage(json, answer.Usage);
    });

    /// <summary>Token counts are optional in the format; zero (unknown) is left out.</summary>
    private static void WriteUsage(Utf8JsonWriter json, TokenUsage usage)
    {
        if (usage.PromptTokens != 0)
        {
            json.WriteNumber("prompt_tokens", usage.PromptTokens);
        }

        if (usage.CompletionTokens != 0)
        {
            json.WriteNumber("completion_tokens", usage.CompletionTokens);
        }
    }

    private static string Write(Action<Utf8JsonWriter> body)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, Options))
        {
            json.WriteStartObject();
            body(json);
            json.WriteEndObject();
        }

        return Encoding.UTF8.GetString(buffer.ToArray());
    }
}
