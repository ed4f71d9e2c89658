namespace Plumbline.Models.Http;

/// <summary>Everything the HTTP backend needs besides the endpoint's address.</summary>
/// <param name="ModelName">The model as the endpoint names it (the request's <c>model</c> field).</param>
/// <param name="Api">Chat or plain completions.</param>
/// <param name="KeyVariable">The environment variable holding the API key; an unset or empty variable sends no key.</param>
/// <param name="Headers">Extra headers, each read from its own environment variable.</param>
/// <param name="Seed">Sent as <c>seed</c> when given.</param>
/// <param name="TopAlternatives">How many top next-token alternatives to ask for when reading answer probabilities.</param>
/// <param name="Votes">Samples per statement when the endpoint gives no log-probabilities.</param>
/// <param name="Resilience">Retries, timeouts and rate limits.</param>
public sealed record HttpModelOptions(
    string ModelName,
    HttpApi Api = HttpApi.Chat,
    string KeyVariable = HttpModelOptions.DefaultKeyVariable,
    IReadOnlyList<HeaderFromVariable>? Headers = null,
    int? Seed = null,
    int TopAlternatives = 20,
    int Votes = 10,
    CallResilienceOptions? Resilience = null)
{
    public const string DefaultKeyVariable = "PLUMB_API_KEY";

    public IReadOnlyList<HeaderFromVariable> ExtraHeaders => Headers ?? [];

    public CallResilienceOptions Calls => Resilience ?? CallResilienceOptions.Default;
}
