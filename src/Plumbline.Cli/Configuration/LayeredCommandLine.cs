using System.CommandLine;
using System.CommandLine.Parsing;
using System.Globalization;

namespace Plumbline.Cli.Configuration;

/// <summary>
/// Settings from four layers, lowest first: built-in defaults &lt; the config file &lt; environment variables &lt;
/// flags. The command line is parsed once to learn the command and the flags given; every setting of that command
/// not given as a flag is then taken from its environment variable, else from the config file, and added to the
/// command line as the flag it stands for; the result is parsed again. So a value from any layer goes through the
/// flag's own checks, and an error in it names where it came from (the file, line and key, or the variable).
/// </summary>
/// <param name="Args">The command line with the settings of the lower layers added.</param>
/// <param name="Config">The config file read; null when there is none.</param>
/// <param name="Origins">Where each setting of the command came from, flags included; a setting not listed is built in.</param>
internal sealed record LayeredCommandLine(IReadOnlyList<string> Args, ConfigFile? Config, IReadOnlyDictionary<ConfigSetting, SettingOrigin> Origins)
{
    public static LayeredCommandLine None { get; } = new([], null, new Dictionary<ConfigSetting, SettingOrigin>());

    /// <summary>Adds the lower layers to a command line parsed without errors.</summary>
    /// <param name="args">The command line as given.</param>
    /// <param name="parse">Its parse.</param>
    /// <param name="configOption">The <c>--config</c> flag.</param>
    /// <param name="environment">Reads an environment variable.</param>
    /// <param name="workingDirectory">Where <see cref="ConfigFile.DefaultName"/> is looked for.</param>
    /// <exception cref="UsageException">The config file cannot be used.</exception>
    public static LayeredCommandLine Apply(
        IReadOnlyList<string> args, ParseResult parse, Option<string?> configOption, Func<string, string?> environment, string workingDirectory)
    {
        var config = FindConfig(parse, configOption, environment, workingDirectory) is { } path ? ConfigFile.Load(path) : null;
        var command = parse.CommandResult.Command;
        var origins = new Dictionary<ConfigSetting, SettingOrigin>();
        var added = new List<string>();
        foreach (var setting in ConfigCatalogue.Settings.Where(s => s.AppliesTo(command.Name)))
        {
            if (command.Options.FirstOrDefault(o => o.Name == setting.Option) is not { } option)
            {
                continue;
            }

            if (parse.GetResult(option) is { Implicit: false })
            {
                origins[setting] = new SettingOrigin(SettingLayer.Flag, setting.Option);
            }
            else if (environment(setting.EnvironmentVariable) is { Length: > 0 } value)
            {
                origins[setting] = new SettingOrigin(SettingLayer.Environment, setting.EnvironmentVariable);
                added.AddRange(setting.TokensFromEnvironment(value));
            }
            else if (config?.Find(setting) is { } entry)
            {
                origins[setting] = new SettingOrigin(SettingLayer.ConfigFile, string.Create(CultureInfo.InvariantCulture, $"{config.Path}:{entry.Line}: {setting.Key}"));
                added.AddRange(setting.TokensFromConfig(entry.Value));
            }
        }

        // Options go before a "--", after which every token is an argument.
        var end = args.ToList().IndexOf("--");
        IReadOnlyList<string> layered = end < 0 ? [.. args, .. added] : [.. args.Take(end), .. added, .. args.Skip(end)];
        return new LayeredCommandLine(layered, config, origins);
    }

    /// <summary>
    /// A parse error in the layered command line, as one line: an error in a value that came from the config file or
    /// the environment names the file, line and key (or the variable) rather than the flag nobody typed.
    /// </summary>
    public string Explain(ParseError error)
    {
        ArgumentNullException.ThrowIfNull(error);
        var option = error.SymbolResult switch
        {
            OptionResult result => result.Option,
            ArgumentResult { Parent: OptionResult result } => result.Option,
            _ => null,
        };
        if (option is null || Origins.FirstOrDefault(o => o.Key.Option == option.Name) is not { Key: not null } found
            || found.Value.Layer is not (SettingLayer.ConfigFile or SettingLayer.Environment))
        {
            return error.Message;
        }

        var message = error.Message.StartsWith(option.Name + ": ", StringComparison.Ordinal) ? error.Message[(option.Name.Length + 2)..] : error.Message;
        return $"{found.Value.Where}: {message}";
    }

    private static string? FindConfig(ParseResult parse, Option<string?> configOption, Func<string, string?> environment, string workingDirectory)
    {
        if (parse.GetValue(configOption) is { Length: > 0 } given)
        {
            return given;
        }

        if (environment(ConfigFile.Variable) is { Length: > 0 } named)
        {
            return named;
        }

        var local = Path.Combine(workingDirectory, ConfigFile.DefaultName);
        return File.Exists(local) ? local : null;
    }
}
