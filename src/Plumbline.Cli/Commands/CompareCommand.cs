using System.CommandLine;
using Plumbline.Application.Running;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Cli.Running;
using Plumbline.Reports.Comparison;
using Plumbline.Reports.Json;

namespace Plumbline.Cli.Commands;

/// <summary>
/// <c>plumb compare OLD NEW</c>: what changed between two runs' JSON reports, and whether the change in correctness
/// (or, without gold labels, in answers) is more than chance. Exit codes: 0, or 1 when the regression gate fails;
/// 2 when a report cannot be read.
/// </summary>
internal static class CompareCommand
{
    public static Command Create(CliContext context, CompositionRoot root)
    {
        var old = new Argument<string>("old") { Description = "The earlier run's JSON (or JSON Lines) report.", HelpName = "OLD" };
        var now = new Argument<string>("new") { Description = "The later run's report.", HelpName = "NEW" };
        var output = new OutputOptions(ComparisonWriters.Formats);
        var alpha = CreateRegressionOption();
        var command = new Command("compare", "Compare two runs' reports: changed claims, figure deltas, McNemar's exact test.");
        command.Arguments.Add(old);
        command.Arguments.Add(now);
        output.AddTo(command);
        command.Options.Add(alpha);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var target = output.Read(parse);
            var (oldFile, newFile) = (parse.GetValue(old)!, parse.GetValue(now)!);
            var before = await ReportJsonReader.ReadFileAsync(oldFile, cancellationToken);
            var after = await ReportJsonReader.ReadFileAsync(newFile, cancellationToken);
            var comparison = await RunComparison.CompareAsync(before, after, oldFile, newFile, parse.GetValue(alpha), cancellationToken);
            foreach (var warning in comparison.Warnings)
            {
                await context.Error.WriteLineAsync(CliErrors.Line("warning: " + warning));
            }

            var writer = ComparisonWriters.Create(target.Format);
            await ResultDestination.WriteAsync(target.Path, context.StandardOutput, stream => writer.WriteAsync(comparison, stream, cancellationToken));

            return ExitCodeDecision.Of(comparison);
        }, cancellationToken));
        return command;
    }

    /// <summary><c>--fail-on-regression ALPHA</c> (also shown by <c>plumb config</c>).</summary>
    public static Option<double?> CreateRegressionOption()
    {
        var alpha = new Option<double?>("--fail-on-regression")
        {
            Description = "Exit 1 when more paired claims went from right to wrong than back and McNemar's exact p-value is below ALPHA " +
                          "(without gold labels: when the answers shifted either way with p below ALPHA).",
            HelpName = "ALPHA",
        };
        alpha.CustomParser = result => NumberParsing.Parse(result, "--fail-on-regression", "a significance level (a number above 0 and below 1)", v => v is > 0 and < 1);
        return alpha;
    }
}
