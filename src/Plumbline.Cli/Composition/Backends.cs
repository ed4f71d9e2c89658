using Plumbline.Cli.Options;
using Plumbline.Core.MaxSat;
using Plumbline.Nli;
using Plumbline.Reports;
using Plumbline.Solver;

namespace Plumbline.Cli.Composition;

/// <summary>
/// The composition root: the one place that knows every adapter and picks the concrete model source,
/// NLI scorer, solver, report writers and clock. Everything else sees only Core's ports.
/// </summary>
internal static class Backends
{
    public static TimeProvider Time => TimeProvider.System;

    public static ReportWriterRegistry Reports => ReportWriterRegistry.Default;

    /// <summary>The solver for WCNF files of any size: the default portfolio, core-guided worker included.</summary>
    public static IMaxSatSolver CreateSolver(TimeSpan? timeLimit = null) =>
        new CpSatMaxSatSolver(CpSatOptions.Default with { TimeLimit = timeLimit }, Time);

    /// <summary>
    /// The solver for one claim's problem (at most 19 variables). The engine runs its two solves side by side, so
    /// one worker each keeps them to the two cores we plan for; measured with the engine benchmark under load:
    /// median 15.6 ms per claim with one worker against 18.4 ms with two.
    /// </summary>
    public static IMaxSatSolver CreateClaimSolver() =>
        new CpSatMaxSatSolver(CpSatOptions.Default with { Workers = 1 }, Time);

    /// <summary>The process environment, where the API key and extra header values are read.</summary>
    public static Func<string, string?> Environment => System.Environment.GetEnvironmentVariable;

    /// <summary>Loads the ONNX NLI model of a folder.</summary>
    /// <exception cref="UsageException">The folder does not exist.</exception>
    /// <exception cref="NliModelException">A model file is missing or unusable.</exception>
    public static OnnxEntailmentScorer OpenScorer(string directory)
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
