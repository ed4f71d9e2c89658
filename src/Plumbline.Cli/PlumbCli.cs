using System.CommandLine;
using Plumbline.Cli.Commands;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Configuration;

namespace Plumbline.Cli;

/// <summary>
/// The command tree and its invocation. The command line is completed from the config file and the environment
/// (<see cref="LayeredCommandLine"/>) before it runs. Parse errors are usage errors: one line, exit code 2.
/// </summary>
internal static class PlumbCli
{
    /// <summary><c>--config FILE</c>, which every command takes.</summary>
    public static Option<string?> CreateConfigOption() => new("--config")
    {
        Description = $"Read default settings from this TOML file (default: {ConfigFile.DefaultName} in the working directory, or the file ${ConfigFile.Variable} names).",
        HelpName = "FILE",
        Recursive = true,
    };

    public static RootCommand Build(CliContext context, CompositionRoot composition) => Build(context, composition, LayeredCommandLine.None);

    public static RootCommand Build(CliContext context, CompositionRoot composition, LayeredCommandLine layers)
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
        root.Subcommands.Add(CompareCommand.Create(context, composition));
        root.Subcommands.Add(MergeCommand.Create(context, composition));
        root.Subcommands.Add(ConfigCommand.Create(context, composition, layers));
        root.Subcommands.Add(DoctorCommand.Create(context, composition));
        root.Options.Add(CreateConfigOption());
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

        var tree = Build(context, root);
        var parse = tree.Parse(args);
        if (parse.Errors.Count > 0)
        {
            return await ParseErrorsAsync(context, parse, LayeredCommandLine.None);
        }

        LayeredCommandLine layers;
        try
        {
            var configOption = (Option<string?>)tree.Options.First(o => o.Name == "--config");
            layers = LayeredCommandLine.Apply(args, parse, configOption, root.Environment, context.WorkingDirectory());
        }
        catch (UsageException e)
        {
            await context.Error.WriteLineAsync(CliErrors.Line(e.Message));
            return ExitCodes.UsageError;
        }

        parse = Build(context, root, layers).Parse(layers.Args);
        if (parse.Errors.Count > 0)
        {
            return await ParseErrorsAsync(context, parse, layers);
        }

        return await parse.InvokeAsync(configuration, cancellationToken);
    }

    private static async Task<int> ParseErrorsAsync(CliContext context, ParseResult parse, LayeredCommandLine layers)
    {
        var command = parse.CommandResult.Command;
        var help = command is RootCommand ? "plumb --help" : $"plumb {command.Name} --help";
        await context.Error.WriteLineAsync(CliErrors.Line($"{string.Join("; ", parse.Errors.Select(layers.Explain))} (see {help})"));
        return ExitCodes.UsageError;
    }
}
