using System.CommandLine;
using Plumbline.Application.Running;
using Plumbline.Application.Shards;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Cli.Running;
using Plumbline.Reports;
using Plumbline.Reports.Json;

namespace Plumbline.Cli.Commands;

/// <summary>
/// <c>plumb merge FILE... -o OUT</c>: combines the JSON (or JSON Lines) reports of every shard of one claim input
/// into the report of the whole run, in any report format. The exit code is the whole run's: 1 when a gate fails on
/// the merged figures, 3 when a shard was incomplete, 2 when the reports do not make one run.
/// </summary>
internal static class MergeCommand
{
    private const string JsonFormat = "json";

    public static Command Create(CliContext context, CompositionRoot root)
    {
        var files = new Argument<string[]>("files")
        {
            Description = "The shards' JSON or JSON Lines reports (every shard K/N once, in any order).",
            HelpName = "FILE",
            Arity = ArgumentArity.OneOrMore,
        };
        var output = new OutputOptions(root.Reports.Formats);
        output.Format.DefaultValueFactory = _ => JsonFormat;
        var gates = new GateOptions();
        var command = new Command("merge", "Merge the reports of a sharded run into the report of the whole run.");
        command.Arguments.Add(files);
        output.AddTo(command);
        gates.AddTo(command);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var target = output.Read(parse);
            var given = gates.Read(parse);
            var shards = new List<ShardReport>();
            foreach (var file in parse.GetValue(files) ?? [])
            {
                shards.Add(new ShardReport(file, await ReportJsonReader.ReadFileAsync(file, cancellationToken)));
            }

            var merged = await ShardMerge.MergeAsync(shards, given.Count > 0 ? given : null, cancellationToken);
            var writer = root.Reports.Create(target.Format, new ReportOptions(Colour: target.Path is null && context.ColourTerminal));
            await ResultDestination.WriteAsync(target.Path, context.StandardOutput, stream => writer.WriteAsync(merged, stream, cancellationToken));

            await context.Error.WriteLineAsync(CliErrors.Line(
                $"merged {shards.Count} shard report(s): {merged.Figures.Claims} of {merged.Header.Input!.Claims} claims judged"));
            return ExitCodeDecision.Of(merged);
        }, cancellationToken));
        return command;
    }
}
