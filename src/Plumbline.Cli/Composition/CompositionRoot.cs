using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Application.Sinks;
using Plumbline.Cli.Options;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.LocalModel;
using Plumbline.Models.Recording;
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

    /// <summary>Opens the language model a <c>--model</c> value names, reading and validating it fully now.</summary>
    public Func<ModelSource, string, CancellationToken, Task<ILanguageModel>> OpenModel { get; init; } = OpenModelAsync;

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
    /// destinations, export folder, claim input, model, NLI model), so that a set-up error costs nothing; then the
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

        using var input = await openInput();
        if (input.Count == 0 || (settings.StrictInput && input.Problems.Count > 0))
        {
            diagnostics.InputProblems(input.Problems);
            throw new UsageException(input.Count == 0
                ? $"{input.Name}: no usable claim ({input.Problems.Count} bad line(s))"
                : $"{input.Name}: {input.Problems.Count} bad line(s); nothing was judged (--strict-input)");
        }

        var model = await OpenModel(settings.Model, settings.Engine.PromptVersion, cancellationToken);
        try
        {
            var scorer = OpenScorer(settings.NliModelDirectory);
            try
            {
                var solver = CreateClaimSolver();
                var engine = new CoherenceEngine(model, scorer, solver, settings.Engine, Time);
                var runSettings = RunSettings.From(settings.Engine, model.Describe, scorer.Describe, solver.Describe, settings.Seed);
                var run = new ClaimRun(engine, runSettings, Time, new RunOptions(
                    ToolVersion.Current,
                    settings.InFlight,
                    settings.Verbose ? PairListing.All : PairListing.Linked));

                var sinks = new List<IRunSink> { diagnostics };
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
                var outcome = await run.RunAsync(input, store, new SinkSet(sinks, diagnostics), gates: null, cancellationToken);
                if (outcome.Bug is { } bug)
                {
                    diagnostics.Bug(bug);
                }

                return outcome.ExitCode;
            }
            finally
            {
                (scorer as IDisposable)?.Dispose();
            }
        }
        finally
        {
            await DisposeAsync(model);
        }
    }

    private static async Task DisposeAsync(object part)
    {
        switch (part)
        {
            case IAsyncDisposable asyncDisposable:
                await asyncDisposable.DisposeAsync();
                break;
            case IDisposable disposable:
                disposable.Dispose();
                break;
        }
    }

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

    /// <exception cref="UsageException">The source's file does not exist or the kind is not supported.</exception>
    /// <exception cref="RecordingFormatException">The recording has a malformed line.</exception>
    /// <exception cref="LocalModelException">The local model folder cannot be used.</exception>
    private static async Task<ILanguageModel> OpenModelAsync(ModelSource source, string promptVersion, CancellationToken cancellationToken)
    {
        switch (source)
        {
            case RecordingModelSource recording:
                if (!File.Exists(recording.Path))
                {
                    throw new UsageException($"{ModelSource.OptionName}: recording file '{recording.Path}' not found");
                }

                return await RecordingLanguageModel.LoadAsync(recording.Path, promptVersion, cancellationToken);
            case LocalModelSource local:
                return LocalLanguageModel.Open(local.Directory, new LocalModelOptions(Threads: local.Threads, Seed: local.Seed));
            default:
                throw new UsageException($"{ModelSource.OptionName}: {source} is not supported");
        }
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
