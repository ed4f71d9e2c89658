using System.Globalization;
using System.Text;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Markdown;

/// <summary>
/// A Markdown summary sized for a pull-request comment: a heading, the figures table, the gates, then the
/// overturned, contested and failed claims (at most <see cref="RowsPerSection"/> each), how the run ended and the
/// notice. Settled claims are left out: the comment is about what needs a look.
/// </summary>
internal sealed class MarkdownReportWriter : IReportWriter
{
    public const string FormatName = "md";

    /// <summary>Rows per claim table; a comment should stay readable on a large run.</summary>
    internal const int RowsPerSection = 25;

    /// <summary>Claim texts in a table cell are cut to this many characters.</summary>
    internal const int ClaimLength = 90;

    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    public string Format => FormatName;

    public async Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(output);
        var figures = report.Figures;
        var text = new StringBuilder();
        text.Append(Invariant, $"## Plumbline run: {ReportText.Count(figures.Claims, "claim")}, {figures.Judged} judged\n\n");
        text.Append(Invariant, $"Model `{Cell(report.Header.Settings.ModelSource)}`, NLI model `{Cell(report.Header.Settings.NliModel)}`, ")
            .Append(Invariant, $"{ReportNumbers.Instant(report.Header.Started)} to {ReportNumbers.Instant(report.Finished)}.\n\n");
        FiguresTable(text, figures);
        GatesTable(text, report.Gates);

        var sections = new Dictionary<ClaimStatus, (List<ClaimReport> Shown, int Total)>
        {
            [ClaimStatus.Overturned] = ([], 0),
            [ClaimStatus.Contested] = ([], 0),
            [ClaimStatus.Failed] = ([], 0),
        };
        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            if (sections.TryGetValue(claim.Status, out var section))
            {
                if (section.Shown.Count < RowsPerSection)
                {
                    section.Shown.Add(claim);
                }

                sections[claim.Status] = (section.Shown, section.Total + 1);
            }
        }

        ClaimTable(text, "Overturned", sections[ClaimStatus.Overturned]);
        ClaimTable(text, "Contested", sections[ClaimStatus.Contested]);
        FailedTable(text, sections[ClaimStatus.Failed]);
        Completion(text, report.Completion);
        text.Append("> ").Append(ReportNotice.Text).Append('\n');

        var bytes = new UTF8Encoding(false).GetBytes(text.ToString());
        await output.WriteAsync(bytes, cancellationToken);
        await output.FlushAsync(cancellationToken);
    }

    internal static void FiguresTable(StringBuilder text, RunFigures figures)
    {
        text.Append("| figure | value |\n|---|---|\n");
        void Row(string name, string value) => text.Append("| ").Append(name).Append(" | ").Append(value).Append(" |\n");
        Row("claims", string.Create(Invariant,
            $"{figures.Claims} ({figures.Settled} settled, {figures.Overturned} overturned, {figures.Contested} contested, {figures.Failed} failed)"));
        Row("direct accuracy", figures.DirectAccuracy is { } direct ? ReportText.Accuracy(direct) : "no gold labels");
        Row("coherent accuracy", figures.CoherentAccuracy is { } coherent ? ReportText.Accuracy(coherent) : "no gold labels");
        if (figures.PairedDirectAccuracy is { } paired)
        {
            Row("paired direct accuracy", ReportText.Accuracy(paired));
        }

        Row("overturn rate", ReportText.Percent(figures.OverturnRate));
        Row("contested rate", ReportText.Percent(figures.ContestedRate));
        Row("two-sided rate", ReportText.Percent(figures.TwoSidedRate));
        Row("mean margin", string.Create(Invariant, $"{ReportText.Weight(figures.MeanMargin)} (normalised {ReportText.Weight(figures.MeanNormalisedMargin)})"));
        if (figures.MeanStability is { } stability)
        {
            Row("mean stability", string.Create(Invariant, $"{ReportText.Percent(stability)} ({figures.StabilityTies} tied)"));
        }

        Row("conflicting pairs", figures.ConflictingPairs.ToString(Invariant));
        Row("cut-off explanations", figures.CutOffDiscarded.ToString(Invariant));
        Row("links found", string.Create(Invariant,
            $"{figures.EntailmentLinks + figures.ContradictionLinks} ({figures.EntailmentLinks} entailment, {figures.ContradictionLinks} contradiction)"));
        Row("model calls", figures.ModelCalls.ToString(Invariant));
        Row("tokens", string.Create(Invariant, $"{figures.Tokens.Total} ({figures.Tokens.PromptTokens} prompt, {figures.Tokens.CompletionTokens} completion)"));
        Row("wall time", ReportText.Duration(figures.WallTime));
        text.Append('\n');
    }

    private static void GatesTable(StringBuilder text, IReadOnlyList<GateResult> gates)
    {
        if (gates.Count == 0)
        {
            return;
        }

        text.Append("### Gates\n\n| gate | value | wanted | result |\n|---|---|---|---|\n");
        foreach (var gate in gates)
        {
            var value = gate.Value is { } v ? ReportText.Weight(v) : "n/a";
            text.Append(Invariant, $"| {Cell(gate.Name)} | {value} | {Cell(gate.Comparison)} {ReportText.Weight(gate.Threshold)} | {(gate.Passed ? "pass" : "**fail**")} |\n");
        }

        text.Append('\n');
    }

    private static void ClaimTable(StringBuilder text, string title, (List<ClaimReport> Shown, int Total) section)
    {
        if (section.Total == 0)
        {
            return;
        }

        text.Append(Invariant, $"### {title} ({section.Total})\n\n");
        text.Append("| id | claim | direct answer | answer | gold | margin | stability | decided by |\n|---|---|---|---|---|---|---|---|\n");
        foreach (var claim in section.Shown)
        {
            var decided = claim.Margin == 0 ? "a tie" : claim.Deciding.Count == 0 ? "" : ReportText.Clause(claim.Deciding[0], claim);
            text.Append(Invariant,
                $"| {Cell(claim.Id)} | {Cell(ReportText.Shorten(ReportText.OneLine(claim.Text), ClaimLength))} | {ReportWords.Answer(claim.DirectAnswer)} | ")
                .Append(Invariant, $"**{ReportWords.Answer(claim.Answer)}** | {(claim.Gold is { } g ? ReportWords.Answer(g) : "")} | {ReportText.Weight(claim.Margin)} ({ReportText.Weight(claim.NormalisedMargin)}) | {ReportText.Stability(claim.Stability)} | {Cell(decided)} |\n");
        }

        More(text, section);
    }

    private static void FailedTable(StringBuilder text, (List<ClaimReport> Shown, int Total) section)
    {
        if (section.Total == 0)
        {
            return;
        }

        text.Append(Invariant, $"### Failed ({section.Total})\n\n| id | claim | reason |\n|---|---|---|\n");
        foreach (var claim in section.Shown)
        {
            text.Append(Invariant, $"| {Cell(claim.Id)} | {Cell(ReportText.Shorten(ReportText.OneLine(claim.Text), ClaimLength))} | {Cell(ReportText.OneLine(claim.Error ?? ""))} |\n");
        }

        More(text, section);
    }

    private static void More(StringBuilder text, (List<ClaimReport> Shown, int Total) section)
    {
        if (section.Total > section.Shown.Count)
        {
            text.Append(Invariant, $"\n\u2026 and {section.Total - section.Shown.Count} more (see the full report).\n");
        }

        text.Append('\n');
    }

    private static void Completion(StringBuilder text, RunCompletion completion)
    {
        if (completion.StoppedBecause is { } reason)
        {
            text.Append("**Stopped:** ").Append(Cell(reason)).Append(Invariant, $"; {completion.NotJudged.Count} claim(s) not judged.\n\n");
        }

        if (completion.Problems.Count > 0)
        {
            text.Append("**Problems**\n\n");
            foreach (var problem in completion.Problems.Take(RowsPerSection))
            {
                text.Append("- ").Append(Cell(problem.Message)).Append('\n');
            }

            text.Append('\n');
        }
    }

    /// <summary>Text safe inside a table cell: one line, pipes and backticks escaped, HTML-like brackets neutralised.</summary>
    internal static string Cell(string text) => ReportText.OneLine(text)
        .Replace("\\", "\\\\", StringComparison.Ordinal)
        .Replace("|", "\\|", StringComparison.Ordinal)
        .Replace("`", "\\`", StringComparison.Ordinal)
        .Replace("<", "&lt;", StringComparison.Ordinal);
}
