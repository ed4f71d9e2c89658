using Plumbline.Core.Coherence;

namespace Plumbline.Core.Runs;

/// <summary>The finished result of a run: what was used, when, the figures and every verdict.</summary>
public sealed record RunReport(
    int SchemaVersion,
    string ToolVersion,
    RunSettings Settings,
    DateTimeOffset Started,
    DateTimeOffset Finished,
    RunFigures Figures,
    IReadOnlyList<Verdict> Verdicts)
{
    /// <summary>Bump when the report's shape changes incompatibly.</summary>
    public const int CurrentSchemaVersion = 1;

    /// <summary>A report whose figures are computed from the verdicts and whose wall time is finished - started.</summary>
    public static RunReport Create(
        string toolVersion,
        RunSettings settings,
        DateTimeOffset started,
        DateTimeOffset finished,
        IReadOnlyList<Verdict> verdicts) =>
        new(CurrentSchemaVersion, toolVersion, settings, started, finished,
            RunFigures.From(verdicts, finished - started), verdicts);
}
