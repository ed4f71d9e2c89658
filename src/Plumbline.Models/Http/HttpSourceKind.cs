using System.Globalization;
using System.Net.Sockets;
using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;
using Polly.Timeout;

namespace Plumbline.Models.Http;

/// <summary>
/// Model sources written as an endpoint's base URL (<c>http://127.0.0.1:8080/v1</c>). Opening one sends
/// a single one-token request: it finds an unreachable endpoint, a refused key or an unknown model
/// before any claim is spent, and learns whether the endpoint gives log-probabilities.
/// </summary>
public sealed class HttpSourceKind(
    HttpModelOptions? options,
    Func<string, string?> environment,
    TimeProvider time,
    Func<HttpMessageHandler>? handlers = null) : IModelSourceKind
{
    /// <summary>The set-up check: one token of an answer, about a fact no model should miss.</summary>
    internal const string ProbePrompt = "Answer each question with True or False.\n\nQ: Is water wet? True or False?\nA:";

    public string Name => "http";

    public string Spelling => "an endpoint's base URL (http://HOST:PORT/v1) with --model-name NAME";

    public bool Recognises(string source) =>
        source.StartsWith("http://", StringComparison.OrdinalIgnoreCase)
        || source.StartsWith("https://", StringComparison.OrdinalIgnoreCase);

    /// <summary>Who answers, without contacting the endpoint: the endpoint, the model, the protocol and
    /// every setting that changes the answers.</summary>
    /// <exception cref="ModelSourceException">The URL or the model name is missing or malformed.</exception>
    public ModelIdentity Identify(string source)
    {
        var (url, settings) = Check(source);
        return IdentityOf(url, settings);
    }

    public async Task<OpenedModel> OpenAsync(string source, ModelOpening opening, CancellationToken cancellationToken)
    {
        var (url, settings) = Check(source);
        var credentials = EndpointCredentials.FromEnvironment(settings, environment);
        var client = new EndpointClient(url, settings, credentials, time, handlers?.Invoke());
        try
        {
            var beliefs = await ProbeAsync(client, settings, credentials, cancellationToken).ConfigureAwait(false);
            var notices = beliefs == BeliefMethod.Votes
                ? new[]
                {
                    string.Create(CultureInfo.InvariantCulture,
                        $"{client.Shown} gives no log-probabilities; beliefs will be estimated from {settings.Votes} sampled answers per statement and marked as estimated"),
                }
                : [];
            return new OpenedModel(new HttpLanguageModel(client, settings, beliefs), IdentityOf(url, settings), Cacheable: true, notices);
        }
        catch
        {
            client.Dispose();
            throw;
        }
    }

    private (Uri Url, HttpModelOptions Settings) Check(string source)
    {
        if (!Uri.TryCreate(source, UriKind.Absolute, out var url) || url.Scheme is not ("http" or "https") || url.Host.Length == 0)
        {
            throw new ModelSourceException($"--model: '{source}' is not an http(s) URL");
        }

        if (url.UserInfo.Length > 0)
        {
            throw new ModelSourceException("--model: put no user or password in the URL; the key comes from an environment variable (PLUMB_API_KEY)");
        }

        if (options is null || string.IsNullOrWhiteSpace(options.ModelName))
        {
            throw new ModelSourceException("--model-name: required with an endpoint URL; give the model's name as the endpoint knows it");
        }

        return (url, options);
    }

    private static ModelIdentity IdentityOf(Uri url, HttpModelOptions settings) => new("http", settings.ModelName,
    [
        new("endpoint", url.AbsoluteUri.TrimEnd('/')),
        new("api", settings.Api == HttpApi.Chat ? "chat" : "completions"),
        new("protocol", WireRequest.ProtocolVersion),
        new("seed", settings.Seed?.ToString(CultureInfo.InvariantCulture) ?? "none"),
        new("top_alternatives", settings.TopAlternatives.ToString(CultureInfo.InvariantCulture)),
        new("votes", settings.Votes.ToString(CultureInfo.InvariantCulture)),
    ]);

    private static async Task<BeliefMethod> ProbeAsync(EndpointClient client, HttpModelOptions settings, EndpointCredentials credentials, CancellationToken cancellationToken)
    {
        var body = WireRequest.Body(settings.Api, settings.ModelName, ProbePrompt, isAnswer: true,
            0.0, 1.0, 1, [], 1, settings.Seed, settings.TopAlternatives);
        WireResponse response;
        try
        {
            response = await client.ProbeAsync(body, cancellationToken).ConfigureAwait(false);
        }
        catch (OperationCanceledException) when (cancellationToken.IsCancellationRequested)
        {
            throw;
        }
        catch (Exception e)
        {
            throw new ModelSourceException(credentials.Redact(Explain(e, client, settings, credentials)), e);
        }

        return response.FirstTokenAlternatives is null ? BeliefMethod.Votes : BeliefMethod.TokenProbabilities;
    }

    private static string Explain(Exception e, EndpointClient client, HttpModelOptions settings, EndpointCredentials credentials)
    {
        var route = $"POST {client.Route.GetLeftPart(UriPartial.Path)}";
        return e switch
        {
            EndpointFailure { Status: 401 or 403 } failure => credentials.HasKey
                ? $"--model: {client.Shown} refused the API key ({failure.Message}); check {settings.KeyVariable}"
                : $"--model: {client.Shown} wants an API key ({failure.Message}); set {settings.KeyVariable}",
            EndpointFailure { Status: 404 } failure =>
                $"--model-name: {route} gave {failure.Message}; check that the endpoint serves model '{settings.ModelName}' and that the base URL ends where the API starts (often /v1)",
            EndpointFailure { Status: 400 or 422 } failure when failure.Message.Contains("model", StringComparison.OrdinalIgnoreCase) =>
                $"--model-name: {client.Shown} does not take model '{settings.ModelName}' ({failure.Message})",
            EndpointFailure { Status: not null } failure => $"--model: {route} gave {failure.Message}",
            EndpointFailure failure => $"--model: {client.Shown} does not answer in the OpenAI-compatible format ({failure.Message})",
            TimeoutRejectedException => $"--model: {client.Shown} did not answer a one-token request within {settings.Calls.AttemptTimeout.TotalSeconds.ToString(CultureInfo.InvariantCulture)} s",
            HttpRequestException { InnerException: SocketException socket } =>
                $"--model: cannot reach {client.Shown} ({socket.SocketErrorCode}); is the server running and the URL right?",
            HttpRequestException => $"--model: cannot reach {client.Shown} ({client.Reason(e)})",
            _ => $"--model: {client.Shown}: {client.Reason(e)}",
        };
    }
}
