using System.Net.Http.Headers;

namespace Plumbline.Models.Http;

/// <summary>
/// The API key and extra header values, read from environment variables once. The key is only ever
/// put into request headers; <see cref="Redact"/> strips it (and every header value) from any text
/// that could reach the user, a report or a log, in case an endpoint echoes it in an error.
/// </summary>
internal sealed class EndpointCredentials
{
    private readonly string? key;
    private readonly (string Name, string Value)[] headers;

    private EndpointCredentials(string? key, (string Name, string Value)[] headers)
    {
        this.key = key;
        this.headers = headers;
    }

    public bool HasKey => key is not null;

    /// <exception cref="Core.Language.Sources.ModelSourceException">A header's variable is unset.</exception>
    public static EndpointCredentials FromEnvironment(HttpModelOptions options, Func<string, string?> environment)
    {
        var key = environment(options.KeyVariable);
        var headers = new List<(string, string)>();
        foreach (var header in options.ExtraHeaders)
        {
            var value = environment(header.Variable);
            if (string.IsNullOrEmpty(value))
            {
                throw new Core.Language.Sources.ModelSourceException(
                    $"--header {header.Name}={header.Variable}: environment variable {header.Variable} is not set");
            }

            headers.Add((header.Name, value));
        }

        return new EndpointCredentials(string.IsNullOrEmpty(key) ? null : key, [.. headers]);
    }

    public void ApplyTo(HttpRequestHeaders target)
    {
        if (key is not null)
        {
            target.Authorization = new AuthenticationHeaderValue("Bearer", key);
        }

        foreach (var (name, value) in headers)
        {
            target.TryAddWithoutValidation(name, value);
        }
    }

    /// <summary>The text with the key and every header value replaced by "***".</summary>
    public string Redact(string text)
    {
        if (key is not null)
        {
            text = text.Replace(key, "***", StringComparison.Ordinal);
        }

        foreach (var (_, value) in headers)
        {
            text = text.Replace(value, "***", StringComparison.Ordinal);
        }

        return text;
    }

    public override string ToString() => HasKey ? "key: set" : "key: none";
}
