using Plumbline.Reports.Json;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Comparison;

/// <summary>What changed between two runs: settings, claims, figures, and whether the change is more than chance.</summary>
/// <param name="OldFile">The old report's file, as given.</param>
/// <param name="NewFile">The new report's file.</param>
/// <param name="Old">The old run's header.</param>
/// <param name="New">The new run's header.</param>
/// <param name="SettingsChanged">Settings that affect verdicts and differ; non-empty means the comparison mixes two causes.</param>
/// <param name="InputsDiffer">The runs read different claim inputs (digests differ, or one report has none).</param>
/// <param name="Paired">Claims judged (or failed) in both runs.</param>
/// <param name="OnlyOld">Ids in the old run only.</param>
/// <param name="OnlyNew">Ids in the new run only.</param>
/// <param name="Changes">Paired claims whose answer, status or gold agreement changed, in the new run's order.</param>
/// <param name="Figures">Run figures, old and new.</param>
/// <param name="Correctness">McNemar on paired correctness against gold; null when no claim carries the same gold label in both.</param>
/// <param name="Answers">McNemar on paired answers; null when no claim was answered in both.</param>
/// <param name="Gate">The regression gate; null when none was set.</param>
public sealed record ComparisonReport(
    string OldFile,
    string NewFile,
    RunHeader Old,
    RunHeader New,
    IReadOnlyList<SettingDifference> SettingsChanged,
    bool InputsDiffer,
    int Paired,
    IReadOnlyList<string> OnlyOld,
    IReadOnlyList<string> OnlyNew,
    IReadOnlyList<ClaimChange> Changes,
    IReadOnlyList<FigureDelta> Figures,
    PairedTest? Correctness,
    PairedTest? Answers,
    RegressionGate? Gate)
{
    /// <summary>The version of the comparison's JSON shape.</summary>
    public const int JsonVersion = 1;

    /// <summary>The warnings a reader must see before the numbers: other settings, other claims.</summary>
    public IReadOnlyList<string> Warnings
    {
        get
        {
            var warnings = new List<string>();
            if (SettingsChanged.Count > 0)
            {
                warnings.Add("the runs used different settings (" +
                    string.Join("; ", SettingsChanged.Select(d => $"{d.Key}: {d.First ?? "none"} -> {d.Second ?? "none"}")) +
                    "); a change below may come from the settings, not from the model");
            }

            if (InputsDiffer)
            {
                warnings.Add("the runs read different claim inputs; only claims with the same id in both are paired");
            }

            return warnings;
        }
    }
}
