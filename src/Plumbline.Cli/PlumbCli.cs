using System.CommandLine;
using Plumbline.Cli.Commands;
using Plumbline.Cli.Composition;

namespace Plumbline.Cli;

/// <summary>The command tree and its invocation. Parse errors are usage errors: one line, exit code 2.</summary>
internal static class PlumbCli
{
    public static RootCommand Build(CliContext context, CompositionRoot composition)
    {
        var root = new RootCommand(
            "plumb: checks whether a language model's true/false answers hold together under its own explanations.\n" +
            "Exit codes: 0 everything judged; 1 a gate failed (solve: no solution); 2 usage or configuration error; " +
            "3 run incomplete (failed claims, interrupted; solve: optimum not proven).");
        root.Subcommands.Add(CheckCommand.Create(context, composition));
        root.Subcommands.Add(SweepCommand.Create(context, composition));
        root.Subcommands.Add(SolveCommand.Create(context, composition));
        root.Subcommands.Add(NliCommand.Create(context, composition));
        root.Subcommands.Add(CacheCommand.Create(context, composition));
        return root;
    }

    public static Task<int> RunAsync(IReadOnlyList<string> args, CliContext context, CancellationToken cancellationToken) =>
        RunAsync(args, context, CompositionRoot.Default, cancellationToken);

    public static async Task<int> RunAsync(IReadOnlyList<string> args, CliContext context, CompositionRoot root, CancellationToken cancellationToken)
    {
        var configuration = new InvocationConfiguration
        {
            Output = context.Output,
            Error = context.Error,
            // Commands catch what they can explain; the caller owns Ctrl+C so that a stopped run still reports.
            EnableDefaultExceptionHandler = false,
            ProcessTerminationTimeout = null,
        };
        if (args.Count == 0)
        {
            await Build(context, root).Parse(["--help"]).InvokeAsync(configuration, cancellationToken);
            return ExitCodes.UsageError;
        }

        var parse = Build(context, root).Parse(args);
        if (parse.Errors.Count > 0)
        {
            var command = parse.CommandResult.Command;
            var help = command is RootCommand ? "plumb --help" : $"plumb {command.Name} --help";
            await context.Error.WriteLineAsync(CliErrors.Line($"{string.Join("; ", parse.Errors.Select(e => e.Message))} (see {help})"));
            return ExitCodes.UsageError;
        }

        return await parse.InvokeAsync(configuration, cancellationToken);
    }
}
