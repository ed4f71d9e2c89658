using Plumbline.Core.Language.Sources;
using Plumbline.LoopbackEndpoint;
using Plumbline.Models.Http;

namespace Plumbline.Models.Tests.Http;

/// <summary>Opens the HTTP source kind against a loopback server, with an environment of the test's choosing.</summary>
internal static class Endpoint
{
    public const string Model = "loopback-model";

    /// <summary>Short delays so that retries take milliseconds.</summary>
    public static CallResilienceOptions Quick(int retries = 3, double attemptSeconds = 2) =>
        new(retries, TimeSpan.FromMilliseconds(5), TimeSpan.FromMilliseconds(50), TimeSpan.FromSeconds(attemptSeconds));

    public static HttpModelOptions Options(HttpApi api = HttpApi.Chat, CallResilienceOptions? calls = null, int? seed = null, int votes = 5) =>
        new(Model, api, Resilience: calls ?? Quick(), Seed: seed, Votes: votes);

    public static Task<OpenedModel> OpenAsync(LoopbackModelServer server, HttpModelOptions? options = null, IReadOnlyDictionary<string, string>? environment = null) =>
        OpenAsync(server.BaseUrl.ToString(), options, environment);

    public static Task<OpenedModel> OpenAsync(string url, HttpModelOptions? options = null, IReadOnlyDictionary<string, string>? environment = null)
    {
        var kind = new HttpSourceKind(options ?? Options(), name => environment?.GetValueOrDefault(name), TimeProvider.System);
        return kind.OpenAsync(url, new ModelOpening("1"), CancellationToken.None);
    }
}
