using System.CommandLine;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;

namespace Plumbline.Cli.Commands;

/// <summary><c>plumb doctor</c>: checks the set-up a run would use and prints ok or what to fix per check. Exit 0, or 2 when a check failed.</summary>
internal static class DoctorCommand
{
    public static Command Create(CliContext context, CompositionRoot root)
    {
        var model = new ModelOptions();
        var nliModel = NliModelOption.Create();
        var command = new Command("doctor", "Check the set-up: the NLI model, the solver, the response cache and (if configured) the model source.");
        model.AddTo(command);
        command.Options.Add(nliModel);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var checks = await new SetUpChecks(root).RunAsync(model.Read(parse), NliModelOption.Read(parse, nliModel), cancellationToken);
            foreach (var check in checks)
            {
                await context.Output.WriteLineAsync(check.ToString().AsMemory(), cancellationToken);
            }

            await context.Output.FlushAsync(cancellationToken);
            return checks.Any(c => c.Outcome == SetUpOutcome.Failed) ? ExitCodes.UsageError : ExitCodes.Success;
        }, cancellationToken));
        return command;
    }
}
