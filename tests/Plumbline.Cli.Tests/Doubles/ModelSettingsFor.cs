using Plumbline.Cli.Options;
using Plumbline.Models.Cache;
using Plumbline.Models.Http;

namespace Plumbline.Cli.Tests.Doubles;

/// <summary>Model settings as the options would give them, for tests that compose a run directly.</summary>
internal static class ModelSettingsFor
{
    public static ModelSettings Recording(string path) => new(
        "recording:" + path,
        Seed: null,
        ModelThreads: null,
        new HttpModelOptions(""),
        ModelOptions.DefaultConcurrentCalls,
        MaxCalls: null,
        MaxTokens: null,
        new CacheSettings(Enabled: false, CacheMode.Use, Directory: null));
}
