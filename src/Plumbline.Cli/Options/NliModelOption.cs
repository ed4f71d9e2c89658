using System.CommandLine;

namespace Plumbline.Cli.Options;

/// <summary><c>--nli-model DIR</c>: the NLI model's folder, by default the one shipped beside the executable.</summary>
internal static class NliModelOption
{
    /// <summary>Where the build copies the shipped model, relative to the executable's folder.</summary>
    public const string ShippedFolder = "models/nli-minilm-int8";

    public static string ShippedDirectory => Path.Combine(AppContext.BaseDirectory, ShippedFolder);

    public static Option<string?> Create() => new("--nli-model")
    {
        Description = "Folder of the NLI model (default: the model shipped with plumb).",
        HelpName = "DIR",
    };

    public static string Read(ParseResult parse, Option<string?> option)
    {
        var value = parse.GetValue(option);
        return string.IsNullOrWhiteSpace(value) ? ShippedDirectory : value;
    }
}
