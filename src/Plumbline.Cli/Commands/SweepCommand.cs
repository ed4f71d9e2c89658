using System.CommandLine;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Input;
using Plumbline.Cli.Options;

namespace Plumbline.Cli.Commands;

/// <summary><c>plumb sweep FILE</c>: judges every claim of a claim file, each as soon as it is read.</summary>
internal static class SweepCommand
{
    public static Command Create(CliContext context)
    {
        var file = new Argument<string>("file")
        {
            Description = "Claim file: JSON Lines ({\"id\", \"claim\", \"gold\", \"tags\"} per line), or .txt with one claim per line.",
            HelpName = "FILE",
        };
        var options = new JudgeOptions(Backends.Reports.Formats);
        var command = new Command("sweep", "Judge every claim in a claim file.");
        command.Arguments.Add(file);
        options.AddTo(command);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, () =>
        {
            var path = parse.GetValue(file)!;
            if (!File.Exists(path))
            {
                throw new UsageException($"{path}: claim file not found");
            }

            var settings = options.Read(parse);
            return JudgeComposition.RunAsync(settings, ClaimFileReader.ReadFileAsync(path, cancellationToken), context, cancellationToken);
        }, cancellationToken));
        return command;
    }
}
