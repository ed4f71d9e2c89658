using System.Globalization;
using System.Text;

namespace Plumbline.Reports.Comparison;

/// <summary>The comparison for a terminal or a CI log: warnings first, then changed claims, figures, the tests and the gate.</summary>
internal sealed class ComparisonTextWriter : IComparisonWriter
{
    public string Format => "text";

    public async Task WriteAsync(ComparisonReport comparison, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        var text = new StringBuilder();
        var c = CultureInfo.InvariantCulture;
        text.Append(c, $"old  {comparison.OldFile} (plumb {comparison.Old.ToolVersion}, started {ReportNumbers.Instant(comparison.Old.Started)})\n");
        text.Append(c, $"new  {comparison.NewFile} (plumb {comparison.New.ToolVersion}, started {ReportNumbers.Instant(comparison.New.Started)})\n");
        foreach (var warning in comparison.Warnings)
        {
            text.Append("WARNING: ").Append(warning).Append('\n');
        }

        text.Append(c, $"\nChanged claims: {comparison.Changes.Count} of {comparison.Paired} paired\n");
        var width = comparison.Changes.Count == 0 ? 0 : comparison.Changes.Max(x => x.Id.Length);
        foreach (var change in comparison.Changes)
        {
            text.Append("    ").Append(change.Id.PadRight(width)).Append("  ").Append(ComparisonWriters.Describe(change)).Append('\n');
        }

        if (comparison.OnlyOld.Count > 0)
        {
            text.Append("Only in old: ").Append(string.Join(", ", comparison.OnlyOld)).Append('\n');
        }

        if (comparison.OnlyNew.Count > 0)
        {
            text.Append("Only in new: ").Append(string.Join(", ", comparison.OnlyNew)).Append('\n');
        }

        text.Append(c, $"\nFigures{"",-21}{"old",12}{"new",12}{"change",12}\n");
        foreach (var figure in comparison.Figures)
        {
            text.Append(c, $"    {figure.Name.Replace('_', ' '),-24}{ComparisonWriters.Figure(figure.Old),12}{ComparisonWriters.Figure(figure.New),12}{ComparisonWriters.Change(figure.Change),12}\n");
        }

        text.Append('\n');
        foreach (var test in new[] { comparison.Correctness, comparison.Answers })
        {
            if (test is not null)
            {
                text.Append(ComparisonWriters.Test(test)).Append('\n');
            }
        }

        if (comparison.Gate is { } gate)
        {
            text.Append(c, $"\nRegression gate (alpha {gate.Alpha.ToString("0.####", c)}): {(gate.Passed ? "pass" : "FAIL")}: {gate.Reason}\n");
        }

        text.Append("\nNote: ").Append(ReportNotice.Text).Append('\n');
        await output.WriteAsync(Encoding.UTF8.GetBytes(text.ToString()), cancellationToken);
        await output.FlushAsync(cancellationToken);
    }
}
