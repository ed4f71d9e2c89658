using System.Globalization;

namespace Plumbline.Cli.Configuration;

/// <summary>
/// One setting that can come from the config file, the environment or a flag. The flag keeps its spelling; the
/// config key is <c>table.key</c>; the environment variable is PLUMB_ and the flag's name in capitals with
/// underscores (<c>--contested-at</c> is PLUMB_CONTESTED_AT) and holds what the flag would.
/// </summary>
/// <param name="Key">The config key, "engine.contested_at".</param>
/// <param name="Option">The flag, "--contested-at".</param>
/// <param name="Kind">The TOML type the config file must give.</param>
/// <param name="Inverted">A switch whose config meaning is the flag's opposite (cache.enabled = false is --no-cache).</param>
/// <param name="Commands">The commands it applies to; empty: every command that has the flag.</param>
internal sealed record ConfigSetting(string Key, string Option, ConfigValueKind Kind, bool Inverted = false, IReadOnlySet<string>? Commands = null)
{
    public string Table => Key[..Key.IndexOf('.', StringComparison.Ordinal)];

    public string EnvironmentVariable { get; } = "PLUMB_" + Option.TrimStart('-').Replace('-', '_').ToUpperInvariant();

    public bool AppliesTo(string command) => Commands is null || Commands.Contains(command);

    /// <summary>The flag's tokens for a value read from an environment variable (lists split at commas).</summary>
    public IReadOnlyList<string> TokensFromEnvironment(string value) => Kind switch
    {
        ConfigValueKind.TextList => [.. value.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries).SelectMany(v => new[] { Option, v })],
        _ => [Option, value],
    };

    /// <summary>The flag's tokens for a config value already checked against <see cref="Kind"/>.</summary>
    public IReadOnlyList<string> TokensFromConfig(object value) => value switch
    {
        bool on => [Option, (on != Inverted) ? "true" : "false"],
        long whole => [Option, whole.ToString(CultureInfo.InvariantCulture)],
        double number => [Option, number.ToString("R", CultureInfo.InvariantCulture)],
        string text => [Option, text],
        IReadOnlyList<string> texts => [.. texts.SelectMany(t => new[] { Option, t })],
        IReadOnlyList<long> wholes => [Option, string.Join(',', wholes.Select(w => w.ToString(CultureInfo.InvariantCulture)))],
        _ => throw new ArgumentException($"{Key}: unexpected value {value}", nameof(value)),
    };
}
