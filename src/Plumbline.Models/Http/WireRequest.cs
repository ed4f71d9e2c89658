using System.Text.Json;

namespace Plumbline.Models.Http;

/// <summary>
/// Builds OpenAI-compatible request bodies. In chat mode the engine's prompt (a few-shot text that ends
/// where the model should continue) is the user message, after a short system message that asks for
/// exactly that continuation. Changing either system message changes what the model says, so it
/// means bumping <see cref="ProtocolVersion"/>, which is part of the model identity and so of every
/// cache key.
/// </summary>
internal static class WireRequest
{
    public const string ProtocolVersion = "1";

    public const string ContinueInstruction =
        "Continue the user's text from exactly where it stops. Reply with the continuation only, on one line.";

    public const string AnswerInstruction = "Reply with one word: True or False.";

    /// <summary>The route relative to the base URL.</summary>
    public static string PathOf(HttpApi api) => api == HttpApi.Chat ? "chat/completions" : "completions";

    /// <param name="topAlternatives">Ask for this many top alternatives of each token (0: no log-probabilities).</param>
    public static byte[] Body(
        HttpApi api,
        string model,
        string prompt,
        bool isAnswer,
        double temperature,
        double topP,
        int maxTokens,
        IReadOnlyList<string> stop,
        int n,
        int? seed,
        int topAlternatives)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer))
        {
            json.WriteStartObject();
            json.WriteString("model", model);
            if (api == HttpApi.Chat)
            {
                json.WriteStartArray("messages");
                Message(json, "system", isAnswer ? AnswerInstruction : ContinueInstruction);
                Message(json, "user", prompt);
                json.WriteEndArray();
            }
            else
            {
                json.WriteString("prompt", prompt);
            }

            json.WriteNumber("temperature", temperature);
            json.WriteNumber("top_p", topP);
            json.WriteNumber("max_tokens", maxTokens);
            json.WriteNumber("n", n);
            if (stop.Count > 0)
            {
                json.WriteStartArray("stop");
                foreach (var s in stop)
                {
                    json.WriteStringValue(s);
                }

                json.WriteEndArray();
            }

            if (seed is { } s2)
            {
                json.WriteNumber("seed", s2);
            }

            if (topAlternatives > 0)
            {
                if (api == HttpApi.Chat)
                {
                    json.WriteBoolean("logprobs", true);
                    json.WriteNumber("top_logprobs", topAlternatives);
                }
                else
                {
                    json.WriteNumber("logprobs", topAlternatives);
                }
            }

            json.WriteBoolean("stream", false);
            json.WriteEndObject();
        }

        return buffer.ToArray();
    }

    private static void Message(Utf8JsonWriter json, string role, string content)
    {
        json.WriteStartObject();
        json.WriteString("role", role);
        json.WriteString("content", content);
        json.WriteEndObject();
    }
}
