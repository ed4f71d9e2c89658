using System.CommandLine;
using Plumbline.Application.Input;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;

namespace Plumbline.Cli.Commands;

/// <summary><c>plumb sweep FILE</c>: judges every claim of a claim file, or of standard input when FILE is "-".</summary>
internal static class SweepCommand
{
    public static Command Create(CliContext context, CompositionRoot root)
    {
        var file = new Argument<string>("file")
        {
            Description = "Claim file, or - for standard input: JSON Lines ({\"id\", \"claim\", \"gold\", \"tags\"} per line), " +
                "CSV with a header (id, claim, gold, tags), or .txt with one claim per line.",
            HelpName = "FILE",
        };
        var options = new JudgeOptions(root.Reports.Formats);
        var command = new Command("sweep", "Judge every claim in a claim file (or standard input).");
        command.Arguments.Add(file);
        options.AddTo(command);
        command.Options.Add(options.ClaimsFormatOption);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, () =>
        {
            var path = parse.GetValue(file)!;
            if (path != "-" && !File.Exists(path))
            {
                throw new UsageException($"{path}: claim file not found");
            }

            var settings = options.Read(parse);
            return root.JudgeAsync(
                settings,
                () => path == "-"
                    ? ClaimInput.OpenStreamAsync(context.StandardInput(), settings.ClaimsFormat, cancellationToken)
                    : ClaimInput.OpenFileAsync(path, settings.ClaimsFormat, cancellationToken),
                context,
                cancellationToken);
        }, cancellationToken));
        return command;
    }
}
