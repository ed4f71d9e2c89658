using Plumbline.Application.Input;
using Plumbline.Core.Coherence;

namespace Plumbline.Cli.Options;

/// <summary>What <c>check</c> and <c>sweep</c> were asked to do, validated.</summary>
/// <param name="Model">Where the model's answers come from, and how it is called.</param>
/// <param name="NliModelDirectory">The NLI model's folder.</param>
/// <param name="Engine">The engine's settings.</param>
/// <param name="ExportWcnfDirectory">Folder for one WCNF file per judged claim; null for none.</param>
/// <param name="Reports">Every report to write, at most one of them to standard output.</param>
internal sealed record JudgeSettings(
    ModelSettings Model,
    string NliModelDirectory,
    CoherenceOptions Engine,
    string? ExportWcnfDirectory,
    IReadOnlyList<ReportTarget> Reports)
{
    /// <summary>One report to standard output in <paramref name="format"/>, nothing else: the plainest run.</summary>
    public JudgeSettings(ModelSettings model, string nliModelDirectory, CoherenceOptions engine, string? exportWcnfDirectory, string format)
        : this(model, nliModelDirectory, engine, exportWcnfDirectory, [new ReportTarget(format, null)])
    {
    }

    /// <summary>The sampling seed the user gave, for the report; null for none.</summary>
    public int? Seed { get; init; }

    /// <summary>List every statement pair in the reports, not only the linked ones.</summary>
    public bool Verbose { get; init; }

    /// <summary>No progress on standard error.</summary>
    public bool Quiet { get; init; }

    /// <summary>Show the stack trace of an unexpected error.</summary>
    public bool Debug { get; init; }

    /// <summary>Claims judged at once.</summary>
    public int InFlight { get; init; } = Application.Running.RunOptions.DefaultInFlight;

    /// <summary>Any bad input line stops the run before anything is spent.</summary>
    public bool StrictInput { get; init; }

    /// <summary>The claim input's format (sweep).</summary>
    public ClaimFileFormat ClaimsFormat { get; init; } = ClaimFileFormat.Auto;

    /// <summary>What makes a JUnit test case fail.</summary>
    public Reports.JunitFailures JunitFailures { get; init; } = Plumbline.Reports.JunitFailures.Default;
}

/// <summary>One report: its format and its file; a null <paramref name="Path"/> is standard output.</summary>
internal sealed record ReportTarget(string Format, string? Path);

/// <summary>The report's format and where it goes; a null <paramref name="Path"/> is standard output (solve, nli).</summary>
internal sealed record OutputSettings(string Format, string? Path);
