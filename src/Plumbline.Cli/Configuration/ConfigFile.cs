using System.Globalization;
using Tomlyn.Parsing;
using Tomlyn.Syntax;

namespace Plumbline.Cli.Configuration;

/// <summary>
/// The config file: TOML, one table per group of settings (<c>[model]</c>, <c>[engine]</c>, <c>[gates]</c> ...). Read
/// with Tomlyn's syntax tree, which keeps every key's line, so an unknown key, a value of the wrong type or a TOML
/// syntax error is reported as <c>file:line: key: problem</c> (exit 2) before anything runs.
/// </summary>
internal sealed class ConfigFile
{
    /// <summary>The name looked for in the working directory.</summary>
    public const string DefaultName = "plumbline.toml";

    /// <summary>The environment variable naming a config file (the <c>--config</c> flag wins over it).</summary>
    public const string Variable = "PLUMB_CONFIG";

    private ConfigFile(string path, IReadOnlyList<ConfigEntry> entries)
    {
        Path = path;
        Entries = entries;
    }

    public string Path { get; }

    public IReadOnlyList<ConfigEntry> Entries { get; }

    public ConfigEntry? Find(ConfigSetting setting) => Entries.FirstOrDefault(e => e.Setting == setting);

    /// <exception cref="UsageException">The file is missing, is not TOML, or holds an unknown key or a value of the wrong type.</exception>
    public static ConfigFile Load(string path)
    {
        if (!File.Exists(path))
        {
            throw new UsageException($"{path}: config file not found");
        }

        var document = SyntaxParser.Parse(File.ReadAllText(path), path, validate: true);
        if (document.Diagnostics.FirstOrDefault(d => d.Kind == DiagnosticMessageKind.Error) is { } error)
        {
            throw Problem(path, error.Span.Start.Line + 1, null, "not valid TOML: " + error.Message);
        }

        var entries = new List<ConfigEntry>();
        foreach (var pair in document.KeyValues)
        {
            Add(entries, path, "", pair);
        }

        foreach (var table in document.Tables)
        {
            var name = KeyText(table.Name!);
            if (table is TableArraySyntax)
            {
                throw Problem(path, Line(table), name, "an array of tables; write [" + name + "] once");
            }

            foreach (var pair in table.Items)
            {
                Add(entries, path, name, pair);
            }
        }

        return new ConfigFile(path, entries);
    }

    private static void Add(List<ConfigEntry> entries, string path, string table, KeyValueSyntax pair)
    {
        var key = table.Length == 0 ? KeyText(pair.Key!) : $"{table}.{KeyText(pair.Key!)}";
        var line = Line(pair);
        var setting = ConfigCatalogue.Find(key);
        if (setting is null)
        {
            throw Problem(path, line, key, UnknownKey(key));
        }

        entries.Add(new ConfigEntry(setting, ValueOf(path, line, setting, pair.Value!), line));
    }

    private static string UnknownKey(string key)
    {
        var dot = key.IndexOf('.', StringComparison.Ordinal);
        var table = dot < 0 ? "" : key[..dot];
        if (key.Contains("api_key", StringComparison.Ordinal) && key != "model.api_key_env")
        {
            return "unknown key; keys are never kept in the config file: put the key in an environment variable and name that variable with model.api_key_env";
        }

        return ConfigCatalogue.Tables.Contains(table)
            ? $"unknown key (known in [{table}]: {string.Join(", ", ConfigCatalogue.KeysOf(table))})"
            : $"unknown key (settings go in the tables {string.Join(", ", ConfigCatalogue.Tables.Select(t => $"[{t}]"))})";
    }

    private static object ValueOf(string path, int line, ConfigSetting setting, ValueSyntax value)
    {
        object? read = (setting.Kind, value) switch
        {
            (ConfigValueKind.Text, StringValueSyntax text) => text.Value,
            (ConfigValueKind.WholeNumber, IntegerValueSyntax whole) => whole.Value,
            (ConfigValueKind.Number, IntegerValueSyntax whole) => (double)whole.Value,
            (ConfigValueKind.Number, FloatValueSyntax number) => number.Value,
            (ConfigValueKind.Switch, BooleanValueSyntax flag) => flag.Value,
            (ConfigValueKind.TextList, ArraySyntax array) when Items(array).All(i => i is StringValueSyntax) =>
                (IReadOnlyList<string>)[.. Items(array).Cast<StringValueSyntax>().Select(s => s.Value!)],
            (ConfigValueKind.WholeNumberList, ArraySyntax array) when Items(array).All(i => i is IntegerValueSyntax) =>
                (IReadOnlyList<long>)[.. Items(array).Cast<IntegerValueSyntax>().Select(i => i.Value)],
            _ => null,
        };
        return read ?? throw Problem(path, line, setting.Key, $"expected {Wanted(setting.Kind)}, found {Found(value)}");
    }

    private static IEnumerable<ValueSyntax?> Items(ArraySyntax array) => array.Items.Select(i => i.Value);

    private static string Wanted(ConfigValueKind kind) => kind switch
    {
        ConfigValueKind.Text => "a string",
        ConfigValueKind.WholeNumber => "a whole number",
        ConfigValueKind.Number => "a number",
        ConfigValueKind.Switch => "true or false",
        ConfigValueKind.TextList => "an array of strings",
        _ => "an array of whole numbers",
    };

    private static string Found(ValueSyntax value) => value switch
    {
        StringValueSyntax => "a string",
        IntegerValueSyntax => "a whole number",
        FloatValueSyntax => "a number with a fraction",
        BooleanValueSyntax => "true or false",
        ArraySyntax => "an array (or one of the wrong items)",
        InlineTableSyntax => "a table",
        _ => "a date or time",
    };

    private static string KeyText(KeySyntax key) =>
        string.Join('.', new[] { Part(key.Key) }.Concat(key.DotKeys.Select(d => Part(d.Key))));

    private static string Part(SyntaxNode? part) => part switch
    {
        BareKeySyntax bare => bare.Key?.Text ?? "",
        StringValueSyntax quoted => quoted.Value ?? "",
        _ => part?.ToString() ?? "",
    };

    private static int Line(SyntaxNodeBase node) => node.Span.Start.Line + 1;

    private static UsageException Problem(string path, int line, string? key, string problem) =>
        new(string.Create(CultureInfo.InvariantCulture, $"{path}:{line}: {(key is null ? "" : key + ": ")}{problem}"));
}
