using System.Globalization;
using System.Text;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Runs;

namespace Plumbline.Reports.Text;

/// <summary>
/// A compact terminal summary: one block per claim, then the run figures and the notice. Lines end in
/// "\n" and numbers use the invariant culture, so the same report always prints the same bytes.
/// </summary>
internal sealed class TextReportWriter(bool colour) : IReportWriter
{
    public const string FormatName = "text";

    /// <summary>Statement texts quoted inside a line are cut to this many characters.</summary>
    internal const int QuoteLength = 60;

    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    private readonly TerminalStyle style = new(colour);

    public string Format => FormatName;

    public async Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(output);
        await using var writer = new StreamWriter(output, new UTF8Encoding(encoderShouldEmitUTF8Identifier: false), leaveOpen: true);
        writer.NewLine = "\n";

        var head = new StringBuilder();
        head.Append(Invariant, $"Plumbline {report.ToolVersion} - {Count(report.Verdicts.Count, "claim")}, ")
            .Append(Invariant, $"{ReportNumbers.Instant(report.Started)} to {ReportNumbers.Instant(report.Finished)}\n");
        await writer.WriteAsync(head, cancellationToken);

        foreach (var verdict in report.Verdicts)
        {
            cancellationToken.ThrowIfCancellationRequested();
            await writer.WriteAsync(ClaimBlock(verdict), cancellationToken);
        }

        await writer.WriteAsync(FiguresBlock(report.Figures), cancellationToken);
        await writer.WriteAsync($"\nNotice: {ReportNotice.Text}\n".AsMemory(), cancellationToken);
        await writer.FlushAsync(cancellationToken);
    }

    internal StringBuilder ClaimBlock(Verdict verdict)
    {
        var block = new StringBuilder("\n");
        block.Append(style.Strong(verdict.Claim.Id)).Append("  ").Append(OneLine(verdict.Claim.Text)).Append('\n');

        block.Append("    answer ").Append(Answer(verdict.Answer))
            .Append(" | direct answer ").Append(Answer(verdict.DirectAnswer));
        if (verdict.PairedDirectAnswer is { } paired)
        {
            block.Append(" (paired ").Append(Answer(paired)).Append(')');
        }

        if (verdict.Claim.Gold is { } gold)
        {
            block.Append(" | gold ").Append(Answer(gold));
        }

        block.Append('\n');
        block.Append("    status ").Append(style.Status(verdict.Status));
        if (verdict.Status != ClaimStatus.Failed)
        {
            block.Append(" | margin ").Append(Weight(verdict.Margin))
                .Append(" (normalised ").Append(Weight(verdict.NormalisedMargin)).Append(')');
            if (verdict.Stability is { } stability)
            {
                block.Append(Invariant, $" | stable in {stability.Agreeing} of {stability.Trees} trees");
                if (stability.Tied)
                {
                    block.Append(" (tied)");
                }
            }

            if (verdict.TwoSided)
            {
                block.Append(" | two-sided");
            }
        }

        block.Append('\n');

        if (verdict.Tree is { } tree)
        {
            var kept = tree.Statements.Count(s => s.Kept);
            block.Append(Invariant, $"    statements {kept} kept, {verdict.PrunedCount} pruned, {verdict.IntegralCount} integral");
            block.Append(Invariant, $" | falsified clauses {verdict.Falsified.Count}");
            if (verdict.CutOffDiscarded > 0)
            {
                block.Append(Invariant, $" | {verdict.CutOffDiscarded} cut-off explanations discarded");
            }

            block.Append('\n');
        }

        foreach (var conflict in verdict.Conflicts)
        {
            block.Append(Invariant, $"    conflict ({(conflict.Dropped ? "dropped" : "kept")}): entailment ")
                .Append(Quote(verdict, conflict.Entailment.From)).Append(" -> ").Append(Quote(verdict, conflict.Entailment.To))
                .Append(Invariant, $" (p {Probability(conflict.Entailment.Probability)}), contradiction the other way (p {Probability(conflict.Contradiction.Probability)})\n");
        }

        var contradictions = verdict.Links.Where(l => l.Kind == EntailmentKind.Contradiction).ToList();
        foreach (var link in contradictions)
        {
            block.Append(Invariant, $"    contradiction (p {Probability(link.Probability)}): ")
                .Append(Quote(verdict, link.From)).Append(" vs ").Append(Quote(verdict, link.To)).Append('\n');
        }

        if (verdict.Error is { } error)
        {
            block.Append("    reason: ").Append(style.Alarm(OneLine(error))).Append('\n');
        }

        return block;
    }

    internal static StringBuilder FiguresBlock(RunFigures figures)
    {
        var block = new StringBuilder("\nRun figures\n");
        block.Append(Invariant, $"    {Count(figures.Claims, "claim")}: {figures.Judged} judged ")
            .Append(Invariant, $"({figures.Settled} settled, {figures.Overturned} overturned, {figures.Contested} contested), ")
            .Append(Invariant, $"{figures.Failed} failed\n");
        if (figures.DirectAccuracy is { } direct && figures.CoherentAccuracy is { } coherent)
        {
            block.Append("    direct accuracy   ").Append(Accuracy(direct)).Append('\n');
            block.Append("    coherent accuracy ").Append(Accuracy(coherent)).Append('\n');
            if (figures.PairedDirectAccuracy is { } paired)
            {
                block.Append("    paired direct accuracy (p(claim) against p(negated claim)) ").Append(Accuracy(paired)).Append('\n');
            }
        }
        else
        {
            block.Append("    accuracy: no judged claim carries a gold label\n");
        }

        block.Append(Invariant, $"    overturn rate {Percent(figures.OverturnRate)} | contested rate {Percent(figures.ContestedRate)}")
            .Append(Invariant, $" | two-sided rate {Percent(figures.TwoSidedRate)} | mean margin {Weight(figures.MeanMargin)}")
            .Append(Invariant, $" (normalised {Weight(figures.MeanNormalisedMargin)})\n");
        if (figures.MeanStability is { } meanStability)
        {
            block.Append(Invariant, $"    mean stability {Percent(meanStability)} of sampled trees give the majority answer | {figures.StabilityTies} ties\n");
        }

        if (figures.ConflictingPairs > 0 || figures.CutOffDiscarded > 0 || figures.EstimatedClaims > 0)
        {
            block.Append(Invariant, $"    conflicting pairs {figures.ConflictingPairs} | cut-off explanations discarded {figures.CutOffDiscarded}")
                .Append(Invariant, $" | claims with estimated probabilities {figures.EstimatedClaims}\n");
        }
        block.Append(Invariant, $"    links found {figures.EntailmentLinks + figures.ContradictionLinks} ")
            .Append(Invariant, $"({figures.EntailmentLinks} entailment, {figures.ContradictionLinks} contradiction)\n");
        block.Append(Invariant, $"    model calls {figures.ModelCalls} | tokens {figures.Tokens.Total} ")
            .Append(Invariant, $"({figures.Tokens.PromptTokens} prompt, {figures.Tokens.CompletionTokens} completion)")
            .Append(Invariant, $" | wall time {Duration(figures.WallTime)}\n");
        return block;
    }

    /// <summary>"#3 "text..."": the id ties the line to the JSON report, the quote makes it readable.</summary>
    private static string Quote(Verdict verdict, int statementId)
    {
        var statements = verdict.Tree?.Statements;
        return statements is not null && statementId >= 0 && statementId < statements.Count
            ? $"#{statementId} \"{Shorten(OneLine(statements[statementId].Text), QuoteLength)}\""
            : $"#{statementId}";
    }

    internal static string Shorten(string text, int length) =>
        text.Length <= length ? text : string.Concat(text.AsSpan(0, length - 1).TrimEnd(), "\u2026");

    /// <summary>Model text can hold line breaks; a block keeps one line per fact.</summary>
    private static string OneLine(string text) =>
        string.Join(' ', text.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries));

    private static string Answer(bool? answer) => answer switch
    {
        true => "true",
        false => "false",
        null => "none",
    };

    private static string Accuracy(Proportion p) =>
        $"{Percent(p.Value)} ({p.Successes} of {p.Total}; Wilson 95% interval {Percent(p.Low)} to {Percent(p.High)})";

    private static string Percent(double share) => (share * 100).ToString("0.0", Invariant) + "%";

    private static string Probability(double p) => ReportNumbers.Round(p, "probability").ToString("0.00##", Invariant);

    private static string Weight(double weight) => ReportNumbers.Round(weight, "weight").ToString("0.0###", Invariant);

    private static string Duration(TimeSpan span) => span.TotalSeconds < 1
        ? ReportNumbers.Milliseconds(span).ToString("0.#", Invariant) + " ms"
        : span.TotalSeconds.ToString("0.0", Invariant) + " s";

    private static string Count(int n, string noun) => n == 1 ? $"1 {noun}" : $"{n} {noun}s";
}
