using System.CommandLine;
using Plumbline.Application;

namespace Plumbline.Cli.Options;

/// <summary><c>--format</c> and <c>--output</c>, shared by every command that writes a result.</summary>
internal sealed class OutputOptions
{
    public OutputOptions(IReadOnlyList<string> formats)
    {
        Format = new Option<string>("--format")
        {
            Description = $"Output format: {string.Join(", ", formats)}.",
            HelpName = "FORMAT",
            DefaultValueFactory = _ => "text",
        };
        Format.AcceptOnlyFromAmong([.. formats]);
        Output = new Option<string?>("--output", "-o")
        {
            Description = "Write the result to FILE instead of standard output.",
            HelpName = "FILE",
        };
    }

    public Option<string> Format { get; }

    public Option<string?> Output { get; }

    public void AddTo(Command command)
    {
        command.Options.Add(Format);
        command.Options.Add(Output);
    }

    /// <exception cref="UsageException">The output file's folder does not exist or the path is a folder:
    /// checked before any work, so a finished run is never lost to an unwritable destination.</exception>
    public OutputSettings Read(ParseResult parse)
    {
        var path = parse.GetValue(Output);
        return new OutputSettings(parse.GetValue(Format)!, path is null ? null : CheckPath("--output", path));
    }

    /// <summary>A file path a result can be written to: not a folder, in a folder that exists.</summary>
    /// <exception cref="UsageException">It cannot be.</exception>
    public static string CheckPath(string option, string path)
    {
        if (path.Length == 0 || Directory.Exists(path))
        {
            throw new UsageException($"{option}: '{path}' is not a file name");
        }

        var folder = Path.GetDirectoryName(Path.GetFullPath(path));
        if (folder is not null && !Directory.Exists(folder))
        {
            throw new UsageException($"{option}: folder '{folder}' does not exist");
        }

        return path;
    }
}
