using System.Globalization;
using System.Text;
using Plumbline.Reports.Markdown;

namespace Plumbline.Reports.Comparison;

/// <summary>The comparison as Markdown, for a pull request comment or a CI job summary.</summary>
internal sealed class ComparisonMarkdownWriter : IComparisonWriter
{
    public string Format => "md";

    public async Task WriteAsync(ComparisonReport comparison, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        var c = CultureInfo.InvariantCulture;
        var text = new StringBuilder("## Plumbline comparison\n\n");
        text.Append(c, $"Old: `{comparison.OldFile}` (plumb {comparison.Old.ToolVersion}); new: `{comparison.NewFile}` (plumb {comparison.New.ToolVersion}).\n\n");
        foreach (var warning in comparison.Warnings)
        {
            text.Append("> **Warning:** ").Append(MarkdownReportWriter.Cell(warning)).Append("\n\n");
        }

        if (comparison.Gate is { } gate)
        {
            text.Append(c, $"**Regression gate (alpha {gate.Alpha.ToString("0.####", c)}): {(gate.Passed ? "pass" : "fail")}.** {MarkdownReportWriter.Cell(gate.Reason)}\n\n");
        }

        text.Append(c, $"### Changed claims ({comparison.Changes.Count} of {comparison.Paired} paired)\n\n");
        if (comparison.Changes.Count > 0)
        {
            text.Append("| id | claim | what changed |\n|---|---|---|\n");
            foreach (var change in comparison.Changes)
            {
                text.Append(c, $"| {MarkdownReportWriter.Cell(change.Id)} | {MarkdownReportWriter.Cell(change.Text)} | {MarkdownReportWriter.Cell(ComparisonWriters.Describe(change))} |\n");
            }

            text.Append('\n');
        }

        if (comparison.OnlyOld.Count > 0 || comparison.OnlyNew.Count > 0)
        {
            text.Append(c, $"Only in old: {comparison.OnlyOld.Count}; only in new: {comparison.OnlyNew.Count}.\n\n");
        }

        text.Append("### Figures\n\n| figure | old | new | change |\n|---|---|---|---|\n");
        foreach (var figure in comparison.Figures)
        {
            text.Append(c, $"| {figure.Name.Replace('_', ' ')} | {ComparisonWriters.Figure(figure.Old)} | {ComparisonWriters.Figure(figure.New)} | {ComparisonWriters.Change(figure.Change)} |\n");
        }

        text.Append('\n');
        foreach (var test in new[] { comparison.Correctness, comparison.Answers })
        {
            if (test is not null)
            {
                text.Append("- ").Append(MarkdownReportWriter.Cell(ComparisonWriters.Test(test))).Append('\n');
            }
        }

        text.Append("\n_").Append(ReportNotice.Text).Append("_\n");
        await output.WriteAsync(Encoding.UTF8.GetBytes(text.ToString()), cancellationToken);
        await output.FlushAsync(cancellationToken);
    }
}
