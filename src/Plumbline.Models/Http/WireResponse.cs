using System.Text.Json;
using Plumbline.Core.Language;

namespace Plumbline.Models.Http;

/// <summary>
/// What one OpenAI-compatible response said: the texts of its choices in index order, the token usage,
/// and, when asked for, the alternatives listed for the first generated token of the first choice.
/// </summary>
internal sealed record WireResponse(IReadOnlyList<string> Texts, TokenUsage Usage, IReadOnlyList<TokenAlternative>? FirstTokenAlternatives)
{
    /// <summary>Parses a body. Chat choices carry <c>message.content</c>, completion choices <c>text</c>;
    /// log-probabilities come either as <c>logprobs.content[0].top_logprobs</c> (the chat shape, which
    /// some servers also use for completions) or as <c>logprobs.top_logprobs[0]</c>, an object from token
    /// to log-probability (the completions shape).</summary>
    /// <exception cref="EndpointFailure">The body is not JSON or lacks the choices (transient: a truncated
    /// or garbled body is worth another try).</exception>
    public static WireResponse Parse(ReadOnlySpan<byte> body, HttpApi api)
    {
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(body.ToArray());
        }
        catch (JsonException e)
        {
            throw new EndpointFailure($"the response is not valid JSON ({e.Message})", transient: true);
        }

        using (document)
        {
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object
                || !root.TryGetProperty("choices", out var choices)
                || choices.ValueKind != JsonValueKind.Array)
            {
                throw new EndpointFailure("the response has no \"choices\" array", transient: true);
            }

            var indexed = new List<(int Index, string Text, JsonElement Choice)>();
            var position = 0;
            foreach (var choice in choices.EnumerateArray())
            {
                var index = choice.TryGetProperty("index", out var i) && i.ValueKind == JsonValueKind.Number && i.TryGetInt32(out var n) ? n : position;
                indexed.Add((index, TextOf(choice, api), choice));
                position++;
            }

            indexed.Sort((a, b) => a.Index.CompareTo(b.Index));
            IReadOnlyList<TokenAlternative>? alternatives = indexed.Count > 0 ? AlternativesOf(indexed[0].Choice) : null;
            return new WireResponse([.. indexed.Select(c => c.Text)], UsageOf(root), alternatives);
        }
    }

    private static string TextOf(JsonElement choice, HttpApi api)
    {
        if (api == HttpApi.Chat
            && choice.TryGetProperty("message", out var message) && message.ValueKind == JsonValueKind.Object
            && message.TryGetProperty("content", out var content))
        {
            return content.ValueKind switch
            {
                JsonValueKind.String => content.GetString()!,
                JsonValueKind.Null => "",
                _ => throw new EndpointFailure("a choice's message.content is not a string", transient: true),
            };
        }

        if (choice.TryGetProperty("text", out var text) && text.ValueKind == JsonValueKind.String)
        {
            return text.GetString()!;
        }

        throw new EndpointFailure(api == HttpApi.Chat ? "a choice has no message.content" : "a choice has no text", transient: true);
    }

    private static List<TokenAlternative>? AlternativesOf(JsonElement choice)
    {
        if (!choice.TryGetProperty("logprobs", out var logprobs) || logprobs.ValueKind != JsonValueKind.Object)
        {
            return null;
        }

        // Chat shape: content[0] = { token, logprob, top_logprobs: [ { token, logprob } ] }.
        if (logprobs.TryGetProperty("content", out var content) && content.ValueKind == JsonValueKind.Array)
        {
            foreach (var first in content.EnumerateArray())
            {
                var list = new List<TokenAlternative>();
                if (first.TryGetProperty("top_logprobs", out var top) && top.ValueKind == JsonValueKind.Array)
                {
                    foreach (var entry in top.EnumerateArray())
                    {
                        if (Alternative(entry) is { } a)
                        {
                            list.Add(a);
                        }
                    }
                }

                if (Alternative(first) is { } chosen)
                {
                    list.Add(chosen);
                }

                return list.Count > 0 ? list : null;
            }

            return null;
        }

        // Completions shape: top_logprobs[0] = { "token": logprob, ... }, tokens[0] / token_logprobs[0] the chosen one.
        var alternatives = new List<TokenAlternative>();
        if (logprobs.TryGetProperty("top_logprobs", out var tops) && tops.ValueKind == JsonValueKind.Array)
        {
            foreach (var first in tops.EnumerateArray())
            {
                if (first.ValueKind == JsonValueKind.Object)
                {
                    foreach (var property in first.EnumerateObject())
                    {
                        if (property.Value.ValueKind == JsonValueKind.Number)
                        {
                            alternatives.Add(new TokenAlternative(property.Name, property.Value.GetDouble()));
                        }
                    }
                }

                break;
            }
        }

        if (logprobs.TryGetProperty("tokens", out var tokens) && tokens.ValueKind == JsonValueKind.Array && tokens.GetArrayLength() > 0
            && logprobs.TryGetProperty("token_logprobs", out var tokenLogprobs) && tokenLogprobs.ValueKind == JsonValueKind.Array
            && tokenLogprobs.GetArrayLength() > 0
            && tokens[0].ValueKind == JsonValueKind.String && tokenLogprobs[0].ValueKind == JsonValueKind.Number)
        {
            alternatives.Add(new TokenAlternative(tokens[0].GetString()!, tokenLogprobs[0].GetDouble()));
        }

        return alternatives.Count > 0 ? alternatives : null;
    }

    private static TokenAlternative? Alternative(JsonElement entry) =>
        entry.ValueKind == JsonValueKind.Object
        && entry.TryGetProperty("token", out var token) && token.ValueKind == JsonValueKind.String
        && entry.TryGetProperty("logprob", out var logprob) && logprob.ValueKind == JsonValueKind.Number
            ? new TokenAlternative(token.GetString()!, logprob.GetDouble())
            : null;

    private static TokenUsage UsageOf(JsonElement root)
    {
        if (!root.TryGetProperty("usage", out var usage) || usage.ValueKind != JsonValueKind.Object)
        {
            return TokenUsage.None;
        }

        return new TokenUsage(Count(usage, "prompt_tokens"), Count(usage, "completion_tokens"));
    }

    private static int Count(JsonElement usage, string name) =>
        usage.TryGetProperty(name, out var value) && value.ValueKind == JsonValueKind.Number && value.TryGetInt32(out var n) && n >= 0 ? n : 0;
}
