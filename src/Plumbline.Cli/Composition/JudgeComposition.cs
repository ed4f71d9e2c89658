using Plumbline.Cli.Options;
using Plumbline.Cli.Running;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports;

namespace Plumbline.Cli.Composition;

/// <summary>
/// Wires a judging run from validated settings and carries it out: cheap checks and loads first (output
/// destination, export folder, NLI model, then the model source and the response cache), so that a set-up
/// error costs nothing; then the run;
/// then the report, which is written whatever stopped the run.
/// </summary>
internal static class JudgeComposition
{
    public static async Task<int> RunAsync(
        JudgeSettings settings,
        IAsyncEnumerable<Claim> claims,
        CliContext context,
        CancellationToken cancellationToken)
    {
        var writer = Backends.Reports.Create(
            settings.Output.Format,
            new ReportOptions(Colour: context.ColourTerminal && settings.Output.Path is null));
        var export = settings.ExportWcnfDirectory is { } folder ? WcnfExport.Open(folder) : null;
        using var scorer = Backends.OpenScorer(settings.NliModelDirectory);
        // Last of the checks, because an endpoint's check is a (one-token) request.
        await using var model = await ModelComposition.OpenAsync(
            settings.Model, settings.Engine.PromptVersion, Backends.Environment, Backends.Time, cancellationToken);
        foreach (var notice in model.Notices)
        {
            await context.Error.WriteLineAsync(CliErrors.Line("note: " + notice));
        }

        var solver = Backends.CreateClaimSolver();
        var engine = new CoherenceEngine(model.Model, scorer, solver, settings.Engine, Backends.Time);
        var runSettings = RunSettings.From(settings.Engine, model.Model.Describe, scorer.Describe, solver.Describe, settings.Model.Seed);

        var outcome = await new JudgeRun(engine, runSettings, Backends.Time, export, context.Error).RunAsync(claims, cancellationToken);
        if (model.CacheSummary() is { } cacheLine)
        {
            await context.Error.WriteLineAsync(CliErrors.Line(cacheLine));
        }

        // The run is over (or was stopped); its report must not be lost to the same cancellation.
        await ResultDestination.WriteReportAsync(writer, outcome.Report, settings.Output.Path, context.Output, CancellationToken.None);
        if (outcome.Stopped is { } reason)
        {
            await context.Error.WriteLineAsync(CliErrors.Line(reason));
        }

        return outcome.ExitCode;
    }
}
