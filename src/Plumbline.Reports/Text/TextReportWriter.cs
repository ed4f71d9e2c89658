using System.Globalization;
using System.Text;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Text;

/// <summary>
/// The terminal report. Per claim: its id and text, the answer and status on one line, then the tree as an indented
/// outline where each statement shows its value in the optimum (T, F, or - when pruned) and its belief, then the few
/// clauses that decided the answer and the contradictions (each pair once, both directions). The full pair list is
/// shown only when the run listed every pair. Then gates, the run figures, how the run ended and the notice.
/// Lines end in "\n" and numbers use the invariant culture, so the same report always prints the same bytes.
/// </summary>
internal sealed class TextReportWriter(bool colour) : IReportWriter
{
    public const string FormatName = "text";

    /// <summary>Statement texts in the outline are cut to this many characters.</summary>
    internal const int StatementLength = 100;

    /// <summary>At most this many deciding clauses per claim: the heaviest ones say why.</summary>
    internal const int DecidingShown = 4;

    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    private readonly TerminalStyle style = new(colour);

    public string Format => FormatName;

    public async Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(output);
        await using var writer = new StreamWriter(output, new UTF8Encoding(encoderShouldEmitUTF8Identifier: false), leaveOpen: true);
        writer.NewLine = "\n";

        var header = report.Header;
        await writer.WriteAsync(string.Create(Invariant,
            $"plumb {header.ToolVersion} | {ReportText.Count(report.Claims.Count, "claim")} | {ReportNumbers.Instant(header.Started)} to {ReportNumbers.Instant(report.Finished)}\n")
            .AsMemory(), cancellationToken);
        await writer.WriteAsync(string.Create(Invariant, $"model {header.Settings.ModelSource} | nli {header.Settings.NliModel}\n").AsMemory(), cancellationToken);

        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            await writer.WriteAsync(ClaimBlock(claim, header.Listing), cancellationToken);
        }

        await writer.WriteAsync(GatesBlock(report.Gates), cancellationToken);
        await writer.WriteAsync(FiguresBlock(report.Figures), cancellationToken);
        await writer.WriteAsync(CompletionBlock(report.Completion), cancellationToken);
        await writer.WriteAsync($"\nNote: {ReportNotice.Text}\n".AsMemory(), cancellationToken);
        await writer.FlushAsync(cancellationToken);
    }

    internal StringBuilder ClaimBlock(ClaimReport claim, PairListing listing)
    {
        var block = new StringBuilder("\n");
        block.Append(style.Strong(claim.Id)).Append("  ").Append(ReportText.OneLine(claim.Text)).Append('\n');
        block.Append("  answer ").Append(style.Strong(ReportWords.Answer(claim.Answer)))
            .Append(" | direct answer ").Append(ReportWords.Answer(claim.DirectAnswer));
        if (claim.PairedDirectAnswer is { } paired && paired != claim.DirectAnswer)
        {
            block.Append(" (paired ").Append(ReportWords.Answer(paired)).Append(')');
        }

        if (claim.Gold is { } gold)
        {
            block.Append(" | gold ").Append(ReportWords.Answer(gold));
        }

        block.Append(" | ").Append(style.Status(claim.Status));
        if (claim.Status != ClaimStatus.Failed)
        {
            block.Append(" | margin ").Append(ReportText.Weight(claim.Margin))
                .Append(" (normalised ").Append(ReportText.Weight(claim.NormalisedMargin)).Append(')');
            if (claim.Stability is { } stability)
            {
                block.Append(" | ").Append(ReportText.Stability(stability));
            }

            if (claim.TwoSided)
            {
                block.Append(" | two-sided");
            }
        }

        block.Append('\n');
        if (claim.Error is { } error)
        {
            block.Append("  reason: ").Append(style.Alarm(ReportText.OneLine(error))).Append('\n');
        }

        if (claim.Statements.Count > 0)
        {
            block.Append(Invariant, $"  tree: {claim.Statements.Count(s => s.Kept)} kept, {claim.PrunedCount} pruned, {claim.IntegralCount} integral")
                .Append(claim.CutOffDiscarded > 0 ? string.Create(Invariant, $", {claim.CutOffDiscarded} cut off") : "")
                .Append(" (value in the optimum T/F, - pruned; b = belief)\n");
            Outline(block, claim, claim.Statements[0], "    ", "    ");
        }

        if (claim.Deciding.Count > 0)
        {
            block.Append("  decided by\n");
            foreach (var clause in claim.Deciding.Take(DecidingShown))
            {
                block.Append("    ").Append(ReportText.Clause(clause, claim)).Append('\n');
            }

            if (claim.Deciding.Count > DecidingShown)
            {
                block.Append(Invariant, $"    and {claim.Deciding.Count - DecidingShown} lighter clause(s)\n");
            }
        }

        if (claim.Conflicts.Count > 0)
        {
            block.Append("  conflicting readings\n");
            foreach (var conflict in claim.Conflicts)
            {
                block.Append("    ").Append(ReportText.Conflict(conflict)).Append('\n');
            }
        }

        var shown = listing == PairListing.All ? claim.Pairs : [.. claim.Pairs.Where(p => p.IsContradiction && p.Linked)];
        if (shown.Count > 0)
        {
            block.Append(listing == PairListing.All ? "  pairs\n" : "  contradictions\n");
            foreach (var pair in shown)
            {
                block.Append("    ").Append(ReportText.Pair(pair)).Append('\n');
            }
        }

        return block;
    }

    private void Outline(StringBuilder block, ClaimReport claim, StatementReport statement, string lead, string childLead)
    {
        block.Append(lead).Append(Invariant, $"#{statement.Id} ").Append(style.Value(statement.Value, statement.Kept))
            .Append(Invariant, $" b{ReportText.Belief(statement.Belief)} ");
        if (statement.GeneratedFor is { } forAnswer)
        {
            block.Append(forAnswer ? "[for true] " : "[for false] ");
        }

        var text = ReportText.Shorten(ReportText.OneLine(statement.Text), StatementLength);
        block.Append(statement.Kept ? text : style.Faint(text)).Append('\n');
        var children = claim.Statements.Where(s => s.Parent == statement.Id).ToList();
        for (var i = 0; i < children.Count; i++)
        {
            var last = i == children.Count - 1;
            Outline(block, claim, children[i], childLead + (last ? "\u2514\u2500 " : "\u251c\u2500 "), childLead + (last ? "   " : "\u2502  "));
        }
    }

    internal static StringBuilder GatesBlock(IReadOnlyList<GateResult> gates)
    {
        var block = new StringBuilder();
        if (gates.Count == 0)
        {
            return block;
        }

        block.Append("\nGates\n");
        foreach (var gate in gates)
        {
            var value = gate.Value is { } v ? ReportText.Weight(v) : "n/a";
            block.Append(Invariant, $"    {(gate.Passed ? "pass" : "FAIL")}  {gate.Name} = {value} (wanted {gate.Comparison} {ReportText.Weight(gate.Threshold)})\n");
        }

        return block;
    }

    internal static StringBuilder FiguresBlock(RunFigures figures)
    {
        var block = new StringBuilder("\nRun figures\n");
        block.Append(Invariant, $"    {ReportText.Count(figures.Claims, "claim")}: {figures.Judged} judged ")
            .Append(Invariant, $"({figures.Settled} settled, {figures.Overturned} overturned, {figures.Contested} contested), ")
            .Append(Invariant, $"{figures.Failed} failed\n");
        if (figures.DirectAccuracy is { } direct && figures.CoherentAccuracy is { } coherent)
        {
            block.Append("    direct accuracy   ").Append(ReportText.Accuracy(direct)).Append('\n');
            block.Append("    coherent accuracy ").Append(ReportText.Accuracy(coherent)).Append('\n');
            if (figures.PairedDirectAccuracy is { } paired)
            {
                block.Append("    paired direct accuracy ").Append(ReportText.Accuracy(paired)).Append('\n');
            }
        }
        else
        {
            block.Append("    accuracy: no judged claim carries a gold label\n");
        }

        block.Append(Invariant, $"    overturn rate {ReportText.Percent(figures.OverturnRate)} | contested rate {ReportText.Percent(figures.ContestedRate)}")
            .Append(Invariant, $" | two-sided rate {ReportText.Percent(figures.TwoSidedRate)} | mean margin {ReportText.Weight(figures.MeanMargin)}")
            .Append(Invariant, $" (normalised {ReportText.Weight(figures.MeanNormalisedMargin)})\n");
        if (figures.MeanStability is { } stability)
        {
            block.Append(Invariant, $"    mean stability {ReportText.Percent(stability)} of sampled trees give the majority answer | {figures.StabilityTies} tied\n");
        }
        block.Append(Invariant, $"    links found {figures.EntailmentLinks + figures.ContradictionLinks} ")
            .Append(Invariant, $"({figures.EntailmentLinks} entailment, {figures.ContradictionLinks} contradiction)")
            .Append(Invariant, $" | conflicting pairs {figures.ConflictingPairs} | cut-off explanations {figures.CutOffDiscarded}\n");
        block.Append(Invariant, $"    model calls {figures.ModelCalls} | tokens {figures.Tokens.Total} ")
            .Append(Invariant, $"({figures.Tokens.PromptTokens} prompt, {figures.Tokens.CompletionTokens} completion)")
            .Append(Invariant, $" | wall time {ReportText.Duration(figures.WallTime)}\n");
        if (figures.EstimatedClaims > 0)
        {
            block.Append(Invariant, $"    beliefs estimated by sampling for {ReportText.Count(figures.EstimatedClaims, "claim")}\n");
        }
        return block;
    }

    internal static StringBuilder CompletionBlock(RunCompletion completion)
    {
        var block = new StringBuilder();
        if (completion.StoppedBecause is { } reason)
        {
            block.Append("\nStopped: ").Append(reason).Append('\n');
        }

        if (completion.NotJudged.Count > 0)
        {
            block.Append(Invariant, $"    not judged ({completion.NotJudged.Count}): ")
                .Append(string.Join(", ", completion.NotJudged.Take(20)))
                .Append(completion.NotJudged.Count > 20 ? ", \u2026" : "").Append('\n');
        }

        if (completion.Problems.Count > 0)
        {
            block.Append("\nProblems\n");
            foreach (var problem in completion.Problems)
            {
                block.Append("    ").Append(ReportText.OneLine(problem.Message)).Append('\n');
            }
        }

        return block;
    }
}
