using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Application.Sinks;
using Plumbline.Cli.Hosting;
using Plumbline.Cli.Options;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language.Sources;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.Nli;
using Plumbline.Reports;
using Plumbline.Reports.Model;
using Plumbline.Solver;

namespace Plumbline.Cli.Composition;

/// <summary>
/// The composition root: the one object that knows every adapter and picks the concrete model source, NLI scorer,
/// solver, report writers and clock, then wires a run from them. Commands receive it; tests build one with
/// doubles in place of the real model, scorer or clock. Everything else sees only Core's ports.
/// </summary>
internal sealed class CompositionRoot
{
    public CompositionRoot()
    {
        CreateSolver = limit => new CpSatMaxSatSolver(CpSatOptions.Default with { TimeLimit = limit }, Time);
        CreateClaimSolver = () => new CpSatMaxSatSolver(CpSatOptions.Default with { Workers = 1 }, Time);
    }

    /// <summary>The real parts: recordings, the shipped ONNX scorer, CP-SAT, the system clock.</summary>
    public static CompositionRoot Default { get; } = new();

    public TimeProvider Time { get; init; } = TimeProvider.System;

    public ReportWriterRegistry Reports { get; init; } = ReportWriterRegistry.Default;

    /// <summary>Where the API key, extra header values and the cache folder convention are read.</summary>
    public Func<string, string?> Environment { get; init; } = System.Environment.GetEnvironmentVariable;

    /// <summary>Opens the model source a <c>--model</c> value names, checking it now (null: through the source registry of
    /// <see cref="ModelComposition"/>). The run wraps it in the call cap, the budget and the response cache.</summary>
    public Func<ModelSettings, string, CancellationToken, Task<OpenedModel>>? OpenModel { get; init; }

    /// <summary>Opens the NLI scorer the engine uses, from a model folder.</summary>
    public Func<string, IEntailmentScorer> OpenScorer { get; init; } = OpenOnnxScorer;

    /// <summary>Opens the ONNX NLI model itself, for <c>plumb nli</c>.</summary>
    public Func<string, OnnxEntailmentScorer> OpenNliModel { get; init; } = OpenOnnxScorer;

    /// <summary>The solver for WCNF files of any size: the default portfolio, core-guided worker included.</summary>
    public Func<TimeSpan?, IMaxSatSolver> CreateSolver { get; init; }

    /// <summary>
    /// The solver for one claim's problem (at most 19 variables). The engine runs its two solves side by side, so
    /// one worker each keeps them to the two cores we plan for; measured with the engine benchmark under load:
    /// median 15.6 ms per claim with one worker against 18.4 ms with two.
    /// </summary>
    public Func<IMaxSatSolver> CreateClaimSolver { get; init; }

    /// <summary>
    /// Wires a judging run from validated settings and carries it out. Cheap checks and loads come first (report
    /// destinations, export folder, claim input, NLI model, then the model source and its cache), so that a set-up error costs nothing; then the
    /// run, whose reports are written whatever stopped it. Returns the exit code.
    /// </summary>
    public async Task<int> JudgeAsync(JudgeSettings settings, Func<Task<ClaimInput>> openInput, CliContext context, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(settings);
        ArgumentNullException.ThrowIfNull(openInput);
        ArgumentNullException.ThrowIfNull(context);
        var diagnostics = new DiagnosticsSink(context.Error, settings.Debug);
        var reportSinks = ReportSinks(settings, context);
        var export = settings.ExportWcnfDirectory is { } folder ? WcnfExportSink.Open(folder) : null;

        using var whole = await openInput();
        if (whole.Count == 0 || (settings.StrictInput && whole.Problems.Count > 0))
        {
            diagnostics.InputProblems(whole.Problems);
            throw new UsageException(whole.Count == 0
                ? $"{whole.Name}: no usable claim ({whole.Problems.Count} bad line(s))"
                : $"{whole.Name}: {whole.Problems.Count} bad line(s); nothing was judged (--strict-input)");
        }

        // A shard may hold no claim at all (more shards than claims): its report is still written, for the merge.
        var input = settings.Shard is { } shard ? whole.Sharded(shard) : whole;

        var scorer = OpenScorer(settings.NliModelDirectory);
        try
        {
            // Last of the checks, because an endpoint's check is a (one-token) request.
            var opened = await (OpenModel ?? OpenFromRegistryAsync)(settings.Model, settings.Engine.PromptVersion, cancellationToken);
            await using var model = await ModelComposition.ComposeAsync(
                opened, settings.Model, settings.Engine.PromptVersion, Environment, Time, cancellationToken);
            foreach (var notice in model.Notices)
            {
                await context.Error.WriteLineAsync(CliErrors.Line("note: " + notice));
            }

            var solver = CreateClaimSolver();
            var engine = new CoherenceEngine(model.Model, scorer, solver, settings.Engine, Time);
            var runSettings = RunSettings.From(settings.Engine, model.Model.Describe, scorer.Describe, solver.Describe, settings.Seed);
            var run = new ClaimRun(engine, runSettings, Time, new RunOptions(
                ToolVersion.Current,
                settings.InFlight,
                settings.Verbose ? PairListing.All : PairListing.Linked));

            var sinks = new List<IRunSink> { diagnostics, new HeapTrimSink() };
            if (export is not null)
            {
                sinks.Add(export);
            }

            sinks.AddRange(reportSinks);
            if (!settings.Quiet)
            {
                sinks.Add(context.ErrorIsTerminal
                    ? new TerminalProgressSink(context.Error)
                    : new PlainProgressSink(context.Error, Time, PlainProgressSink.DefaultInterval));
            }

            diagnostics.InputProblems(input.Problems);
            await using var store = SpillClaimStore.Create();
            var outcome = await run.RunAsync(input, store, new SinkSet(sinks, diagnostics), GatesOf(settings.Gates), cancellationToken);
            if (outcome.Bug is { } bug)
            {
                diagnostics.Bug(bug);
            }

            if (model.CacheSummary() is { } cacheLine)
            {
                await context.Error.WriteLineAsync(CliErrors.Line(cacheLine));
            }

            return outcome.ExitCode;
        }
        finally
        {
            (scorer as IDisposable)?.Dispose();
        }
    }

    private static Func<RunFigures, IReadOnlyList<GateResult>>? GatesOf(IReadOnlyList<Gate> gates) =>
        gates.Count == 0 ? null : figures => Gate.CheckAll(gates, figures);

    private Task<OpenedModel> OpenFromRegistryAsync(ModelSettings settings, string promptVersion, CancellationToken cancellationToken) =>
        ModelComposition.OpenAsync(settings, promptVersion, Environment, Time, cancellationToken);

    /// <summary>One sink per report: streaming formats write as the run goes, the others once it is over.</summary>
    private List<IRunSink> ReportSinks(JudgeSettings settings, CliContext context)
    {
        var sinks = new List<IRunSink>();
        foreach (var target in settings.Reports)
        {
            var toTerminal = target.Path is null && context.ColourTerminal;
            var writer = Reports.Create(target.Format, new ReportOptions(Colour: toTerminal, settings.JunitFailures));
            var destination = target.Path is { } path
                ? ReportDestination.File(path)
                : ReportDestination.StandardOutput(context.StandardOutput);
            sinks.Add(writer is IStreamingReportWriter streaming
                ? new StreamingReportSink(streaming, destination)
                : new ReportSink(writer, destination));
        }

        return sinks;
    }

    /// <summary>Loads the ONNX NLI model of a folder.</summary>
    /// <exception cref="UsageException">The folder does not exist.</exception>
    /// <exception cref="NliModelException">A model file is missing or unusable.</exception>
    private static OnnxEntailmentScorer OpenOnnxScorer(string directory)
    {
        if (!Directory.Exists(directory))
        {
            throw new UsageException(directory == NliModelOption.ShippedDirectory
                ? $"--nli-model: the shipped NLI model is missing from '{directory}'; pass --nli-model DIR"
                : $"--nli-model: folder '{directory}' not found");
        }

        return OnnxEntailmentScorer.Load(directory);
    }
}
