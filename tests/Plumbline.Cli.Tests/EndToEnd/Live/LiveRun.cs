using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using Plumbline.LoopbackEndpoint;

namespace Plumbline.Cli.Tests.EndToEnd.Live;

/// <summary>
/// A temp folder with a claim file, and the command lines that judge it against a loopback endpoint as
/// a separate <c>plumb</c> process. The cache always lives in the folder (never in the user's cache).
/// </summary>
internal sealed class LiveRun : IDisposable
{
    public const string ModelName = "loopback-model";

    private readonly TempDirectory folder = new();

    public LiveRun(int claims, string prefix = "Invented claim")
    {
        ClaimFile = WriteClaims("claims.jsonl", Enumerable.Range(1, claims).Select(i => (Id(i), Claim(prefix, i))));
    }

    public string Folder => folder.Path;

    public string ClaimFile { get; }

    public string CacheDir => folder.File("cache");

    public string File(string name) => folder.File(name);

    public static string Id(int i) => string.Create(CultureInfo.InvariantCulture, $"k{i:00}");

    public static string Claim(string prefix, int i) => string.Create(CultureInfo.InvariantCulture, $"{prefix} number {i} holds.");

    public string WriteClaims(string name, IEnumerable<(string Id, string Text)> claims)
    {
        var text = new StringBuilder();
        foreach (var (id, claim) in claims)
        {
            text.Append(JsonSerializer.Serialize(new { id, claim })).Append('\n');
        }

        return folder.Write(name, text.ToString());
    }

    /// <summary>sweep arguments for the endpoint, with a JSON report written to <paramref name="report"/>.</summary>
    public string[] Sweep(LoopbackModelServer server, string report, string? claimFile = null, string? cacheDir = null, params string[] more) =>
    [
        "sweep", claimFile ?? ClaimFile,
        "--model", server.BaseUrl.ToString(), "--model-name", ModelName,
        "--cache-dir", cacheDir ?? CacheDir,
        "--format", "json", "-o", report,
        .. more,
    ];

    /// <summary>The environment of every run: the cache folder convention pointed into the temp folder too.</summary>
    public Dictionary<string, string> Environment(string? key = null)
    {
        var environment = new Dictionary<string, string> { ["XDG_CACHE_HOME"] = folder.File("xdg") };
        if (key is not null)
        {
            environment["PLUMB_API_KEY"] = key;
        }

        return environment;
    }

    public async Task<PlumbResult> RunAsync(string[] args, string? key = null)
    {
        using var run = PlumbProcess.Start(Folder, Environment(key), args);
        return await run.WaitAsync(TimeSpan.FromMinutes(5));
    }

    /// <summary>The report without what depends on the clock or the run's timing.</summary>
    public static JsonNode WithoutTimes(string reportPath)
    {
        var node = JsonNode.Parse(System.IO.File.ReadAllText(reportPath))!;
        Strip(node);
        return node;
    }

    public void Dispose() => folder.Dispose();

    private static void Strip(JsonNode? node)
    {
        switch (node)
        {
            case JsonObject o:
                foreach (var name in o.Select(p => p.Key).ToList())
                {
                    if (name is "started" or "finished" or "timings" || name.EndsWith("_ms", StringComparison.Ordinal))
                    {
                        o.Remove(name);
                    }
                    else
                    {
                        Strip(o[name]);
                    }
                }

                break;
            case JsonArray a:
                foreach (var item in a)
                {
                    Strip(item);
                }

                break;
        }
    }
}
