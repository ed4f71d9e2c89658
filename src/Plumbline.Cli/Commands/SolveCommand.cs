using System.CommandLine;
using System.Globalization;
using System.Text;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Cli.Running;
using Plumbline.Core.MaxSat;
using Plumbline.Solver.Wcnf;

namespace Plumbline.Cli.Commands;

/// <summary>
/// <c>plumb solve FILE</c>: solves a WCNF file (either format generation) and prints status, cost and size.
/// Exit codes: 0 optimum proven, 1 the hard clauses are unsatisfiable (no solution exists), 2 unreadable
/// or malformed file, 3 the search stopped (time limit) before proving an optimum.
/// </summary>
internal static class SolveCommand
{
    private static readonly string[] Formats = ["text", "json"];

    public static Command Create(CliContext context, CompositionRoot root)
    {
        var file = new Argument<string>("file") { Description = "A WCNF file: 'p wcnf'/'p cnf' header, or the 2022 form with 'h' for hard clauses.", HelpName = "FILE" };
        var output = new OutputOptions(Formats);
        var timeLimit = new Option<double?>("--time-limit")
        {
            Description = "Stop the search after SECONDS and report the best cost found.",
            HelpName = "SECONDS",
        };
        timeLimit.CustomParser = result => NumberParsing.Parse(result, "--time-limit", "a positive number of seconds", v => v > 0);

        var command = new Command("solve", "Solve a weighted MAX-SAT problem in WCNF and print its optimum cost.");
        command.Arguments.Add(file);
        output.AddTo(command);
        command.Options.Add(timeLimit);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var settings = output.Read(parse);
            var limit = parse.GetValue(timeLimit) is { } seconds ? TimeSpan.FromSeconds(seconds) : (TimeSpan?)null;
            var solver = root.CreateSolver(limit);
            var summary = await WcnfSolving.SolveFileAsync(parse.GetValue(file)!, solver, cancellationToken);
            var text = settings.Format == "json" ? Json(summary) : Text(summary);
            await ResultDestination.WriteTextAsync(settings.Path, context.Output, text, cancellationToken);
            if (summary.Message is { } message)
            {
                await context.Error.WriteLineAsync(CliErrors.Line($"{summary.File}: {message}"));
            }

            return ExitCodeOf(summary.Status);
        }, cancellationToken));
        return command;
    }

    internal static int ExitCodeOf(SolveStatus status) => status switch
    {
        SolveStatus.Optimal => ExitCodes.Success,
        SolveStatus.Unsatisfiable => ExitCodes.GateFailed,
        _ => ExitCodes.Incomplete,
    };

    internal static string StatusName(SolveStatus status) => status.ToString().ToLowerInvariant();

    internal static string FormatName(WcnfFormat format) => format switch
    {
        WcnfFormat.Pre2022Weighted => "p wcnf",
        WcnfFormat.Pre2022Unweighted => "p cnf",
        _ => "2022",
    };

    private static string Text(WcnfSolveSummary summary)
    {
        var text = new StringBuilder();
        void Row(string name, string value) => text.Append(CultureInfo.InvariantCulture, $"  {name,-10} {value}\n");
        text.Append(CultureInfo.InvariantCulture, $"solve {summary.File}\n");
        Row("status", StatusName(summary.Status));
        Row("cost", summary.Cost?.ToString(CultureInfo.InvariantCulture) ?? "-");
        Row("variables", summary.Variables.ToString(CultureInfo.InvariantCulture));
        Row("clauses", string.Create(CultureInfo.InvariantCulture, $"{summary.HardClauses} hard, {summary.SoftClauses} soft"));
        Row("format", FormatName(summary.Format) + (summary.Top is { } top ? string.Create(CultureInfo.InvariantCulture, $", top {top}") : ""));
        Row("time", string.Create(CultureInfo.InvariantCulture, $"{summary.WallTime.TotalSeconds:0.000} s"));
        return text.ToString();
    }

    private static string Json(WcnfSolveSummary summary) => JsonText.Object(json =>
    {
        json.WriteString("file", summary.File);
        json.WriteString("format", FormatName(summary.Format));
        json.WriteNullable("top", summary.Top);
        json.WriteString("status", StatusName(summary.Status));
        json.WriteNullable("cost", summary.Cost);
        json.WriteNumber("variables", summary.Variables);
        json.WriteNumber("hard_clauses", summary.HardClauses);
        json.WriteNumber("soft_clauses", summary.SoftClauses);
        json.WriteNumber("seconds", Math.Round(summary.WallTime.TotalSeconds, 6));
        json.WriteNullable("message", summary.Message);
    });
}
