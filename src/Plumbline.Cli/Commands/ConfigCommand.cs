using System.CommandLine;
using System.Globalization;
using System.Text;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Configuration;
using Plumbline.Cli.Options;
using Plumbline.Core.Trees;
using Plumbline.Models.Cache;

namespace Plumbline.Cli.Commands;

/// <summary>
/// <c>plumb config</c>: every setting a judging run would use, its value and where it came from (built-in default,
/// config file with its line, environment variable, or flag), with secrets hidden. It takes the flags
/// <c>check</c> and <c>sweep</c> take, so a command line can be tried out; it checks them as a run would (exit 2).
/// </summary>
internal static class ConfigCommand
{
    public static Command Create(CliContext context, CompositionRoot root, LayeredCommandLine layers)
    {
        var judge = new JudgeOptions(root.Reports.Formats);
        var regression = CompareCommand.CreateRegressionOption();
        var command = new Command("config", "Show every setting a run would use and where it came from (secrets hidden).");
        judge.AddTo(command);
        command.Options.Add(judge.ClaimsFormatOption);
        command.Options.Add(regression);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            judge.Read(parse);
            var text = new StringBuilder();
            text.Append("config file: ").Append(layers.Config?.Path
                ?? $"none ({ConfigFile.DefaultName} is not in {context.WorkingDirectory()}; --config FILE or {ConfigFile.Variable} names one)").Append('\n');
            var rows = ConfigCatalogue.Settings.Select(setting =>
            {
                var option = command.Options.First(o => o.Name == setting.Option);
                var origin = layers.Origins.GetValueOrDefault(setting) ?? SettingOrigin.BuiltIn;
                return (setting.Key, Value: Shown(setting, ValueOf(parse, option, origin), root.Environment), Origin: origin.ToString());
            }).ToList();
            var width = rows.Max(r => r.Key.Length) + 2;
            foreach (var (key, value, origin) in rows)
            {
                text.Append(key.PadRight(width)).Append(value).Append("  [").Append(origin).Append("]\n");
            }

            text.Append("\nEach setting above can also be set by an environment variable: PLUMB_ and its name in capitals, - as _ ")
                .Append("(--contested-at is PLUMB_CONTESTED_AT). Flags beat the environment, which beats the config file.\n");
            await context.Output.WriteAsync(text.ToString().AsMemory(), cancellationToken);
            await context.Output.FlushAsync(cancellationToken);
            return ExitCodes.Success;
        }, cancellationToken));
        return command;
    }

    /// <summary>The value as given (flag, variable or config), or the built-in default.</summary>
    private static string? ValueOf(ParseResult parse, Option option, SettingOrigin origin)
    {
        if (origin.Layer != SettingLayer.BuiltIn)
        {
            var tokens = parse.GetResult(option)?.Tokens.Select(t => t.Value).ToList() ?? [];
            return tokens.Count == 0 ? "true" : string.Join(", ", tokens);
        }

        return option.Name switch
        {
            "--tree-widths" => TreeShapeOption.Describe(TreeShape.Default),
            "--nli-model" => "the model shipped with plumb",
            _ when option.HasDefaultValue => Spell(option.GetDefaultValue()),
            _ => null,
        };
    }

    private static string? Spell(object? value) => value switch
    {
        null => null,
        bool b => b ? "true" : "false",
        double d => d.ToString("R", CultureInfo.InvariantCulture),
        IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
        string[] list => list.Length == 0 ? null : string.Join(", ", list),
        _ => value.ToString(),
    };

    private static string Shown(ConfigSetting setting, string? value, Func<string, string?> environment) => (setting.Key, value) switch
    {
        ("cache.dir", null) => CacheDirectory.Default(environment) + " (default folder)",
        (_, null) => "(not set)",
        (_, "true" or "false") when setting.Inverted => value == "true" ? "false" : "true",
        ("model.source", _) => SecretMask.Source(value),
        ("model.api_key_env", _) => SecretMask.Variable(value, environment),
        ("model.headers", _) => string.Join(", ", value.Split(", ").Select(h => h.Contains('=', StringComparison.Ordinal)
            ? $"{h[..h.IndexOf('=', StringComparison.Ordinal)]}={SecretMask.Variable(h[(h.IndexOf('=', StringComparison.Ordinal) + 1)..], environment)}"
            : h)),
        _ => value,
    };
}
