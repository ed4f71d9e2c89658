using System.Collections.Frozen;
using Plumbline.Core.Runs;
using static Plumbline.Cli.Configuration.ConfigValueKind;

namespace Plumbline.Cli.Configuration;

/// <summary>Every setting the config file and the environment can give, grouped in tables, in the order <c>plumb config</c> lists them.</summary>
internal static class ConfigCatalogue
{
    /// <summary>The commands that judge (and <c>plumb config</c>, which shows what they would use).</summary>
    private static readonly FrozenSet<string> Judging = FrozenSet.Create(StringComparer.Ordinal, "check", "sweep", "config");

    public static IReadOnlyList<ConfigSetting> Settings { get; } =
    [
        new("model.source", "--model", Text),
        new("model.name", "--model-name", Text),
        new("model.api", "--api", Text),
        new("model.api_key_env", "--api-key-env", Text),
        new("model.headers", "--header", TextList),
        new("model.seed", "--seed", WholeNumber),
        new("model.threads", "--model-threads", WholeNumber),
        new("model.votes", "--votes", WholeNumber),
        new("model.retries", "--retries", WholeNumber),
        new("model.retry_delay", "--retry-delay", Number),
        new("model.call_timeout", "--call-timeout", Number),
        new("model.requests_per_minute", "--requests-per-minute", WholeNumber),
        new("model.tokens_per_minute", "--tokens-per-minute", WholeNumber),
        new("model.concurrent_calls", "--concurrent-calls", WholeNumber),
        new("model.max_calls", "--max-calls", WholeNumber),
        new("model.max_tokens", "--max-tokens", WholeNumber),
        new("cache.dir", "--cache-dir", Text),
        new("cache.enabled", "--no-cache", Switch, Inverted: true),
        new("cache.refresh", "--refresh-cache", Switch),
        new("nli.model", "--nli-model", Text),
        new("tree.widths", "--tree-widths", WholeNumberList),
        new("engine.negation", "--negation", Text),
        new("engine.weighting", "--weighting", Text),
        new("engine.contested_at", "--contested-at", Number),
        new("engine.integrity_gap", "--integrity-gap", Number),
        new("engine.belief_form", "--belief-form", Text),
        new("engine.link_floor", "--link-floor", Number),
        new("engine.conflicts", "--conflicts", Text),
        new("engine.contradictions", "--contradictions", Text),
        new("engine.nli_text", "--nli-text", Text),
        new("engine.cut_off", "--cut-off", Text),
        new("engine.integral_claim", "--integral-claim", Text),
        new("engine.claim_belief", "--claim-belief", Text),
        new("engine.direct_answer", "--direct-answer", Text),
        new("engine.samples", "--samples", WholeNumber),
        .. Gate.Names.Select(name => new ConfigSetting("gates." + name, "--" + name.Replace('_', '-'), name == "max_failed" ? WholeNumber : Number)),
        new("gates.fail_on_regression", "--fail-on-regression", Number),
        new("reports.write", "--report", TextList, Commands: Judging),
        new("reports.format", "--format", Text, Commands: Judging),
        new("reports.junit_fail_on", "--junit-fail-on", Text, Commands: Judging),
        new("reports.verbose", "--verbose", Switch, Commands: Judging),
        new("run.in_flight", "--in-flight", WholeNumber, Commands: Judging),
        new("run.strict_input", "--strict-input", Switch, Commands: Judging),
        new("run.quiet", "--quiet", Switch, Commands: Judging),
        new("run.claims_format", "--claims-format", Text, Commands: Judging),
        new("run.shard", "--shard", Text, Commands: Judging),
    ];

    public static IReadOnlyList<string> Tables { get; } = [.. Settings.Select(s => s.Table).Distinct()];

    private static readonly FrozenDictionary<string, ConfigSetting> ByKey = Settings.ToFrozenDictionary(s => s.Key, StringComparer.Ordinal);

    public static ConfigSetting? Find(string key) => ByKey.GetValueOrDefault(key);

    /// <summary>The keys of one table, for the message about an unknown key.</summary>
    public static IEnumerable<string> KeysOf(string table) =>
        Settings.Where(s => s.Table == table).Select(s => s.Key[(table.Length + 1)..]);
}
