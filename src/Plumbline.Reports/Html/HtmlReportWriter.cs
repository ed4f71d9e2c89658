using System.Globalization;
using System.Text;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Html;

/// <summary>
/// One self-contained HTML page (styles and script inline, no external asset, works offline): the caution, the run
/// figures, gates and how the run ended, a table of claims that can be filtered by status and text, and per claim
/// its tree drawn as SVG with each statement's value in the optimum and belief, and the entailment and contradiction
/// links between statements. The claims are read twice (table, then trees) and written as they are read.
/// </summary>
internal sealed class HtmlReportWriter : IReportWriter
{
    public const string FormatName = "html";

    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    private static readonly ClaimStatus[] Statuses = [ClaimStatus.Settled, ClaimStatus.Overturned, ClaimStatus.Contested, ClaimStatus.Failed];

    public string Format => FormatName;

    public async Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(output);
        await using var writer = new StreamWriter(output, new UTF8Encoding(false), 1 << 16, leaveOpen: true) { NewLine = "\n" };
        var header = report.Header;
        var figures = report.Figures;

        var head = new StringBuilder();
        head.Append("<!doctype html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append(Invariant, $"<title>Plumbline report: {ReportText.Count(figures.Claims, "claim")}</title>\n")
            .Append("<style>\n").Append(HtmlAssets.Style).Append("</style>\n</head>\n<body>\n")
            .Append("<header class=\"masthead\">\n<h1><span class=\"mark\" aria-hidden=\"true\">&#x2534;</span> Plumbline report</h1>\n")
            .Append(Invariant, $"<p class=\"meta\">plumb {E(header.ToolVersion)} &middot; model <code>{E(header.Settings.ModelSource)}</code> &middot; NLI <code>{E(header.Settings.NliModel)}</code><br>")
            .Append(Invariant, $"{ReportNumbers.Instant(header.Started)} to {ReportNumbers.Instant(report.Finished)} &middot; contested at margin {ReportText.Weight(header.Settings.ContestedThreshold)}</p>\n</header>\n")
            .Append("<aside class=\"caution\" role=\"note\"><strong>Read with care.</strong> ").Append(E(ReportNotice.Text)).Append("</aside>\n");
        Figures(head, figures);
        Gates(head, report.Gates);
        Completion(head, report.Completion);
        Filters(head, figures);
        await writer.WriteAsync(head, cancellationToken);

        var index = 0;
        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            await writer.WriteAsync(Row(claim, ++index), cancellationToken);
        }

        await writer.WriteAsync("</tbody>\n</table>\n</section>\n<section class=\"trees\">\n<h2>Reasoning per claim</h2>\n".AsMemory(), cancellationToken);
        await writer.WriteAsync(HtmlAssets.Legend.AsMemory(), cancellationToken);
        index = 0;
        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            await writer.WriteAsync(Article(claim, ++index, header.Listing), cancellationToken);
        }

        await writer.WriteAsync("</section>\n<script>\n".AsMemory(), cancellationToken);
        await writer.WriteAsync(HtmlAssets.Script.AsMemory(), cancellationToken);
        await writer.WriteAsync("</script>\n</body>\n</html>\n".AsMemory(), cancellationToken);
        await writer.FlushAsync(cancellationToken);
    }

    private static void Figures(StringBuilder html, RunFigures figures)
    {
        html.Append("<section class=\"figures\">\n<h2>Run figures</h2>\n<dl class=\"cards\">\n");
        void Card(string name, string value, string? note = null) =>
            html.Append("<div><dt>").Append(E(name)).Append("</dt><dd>").Append(E(value)).Append("</dd>")
                .Append(note is null ? "" : "<small>" + E(note) + "</small>").Append("</div>\n");
        Card("claims", figures.Claims.ToString(Invariant), string.Create(Invariant,
            $"{figures.Settled} settled, {figures.Overturned} overturned, {figures.Contested} contested, {figures.Failed} failed"));
        Card("direct accuracy", figures.DirectAccuracy is { } d ? ReportText.Percent(d.Value) : "n/a",
            figures.DirectAccuracy is { } dd ? string.Create(Invariant, $"{dd.Successes} of {dd.Total}; 95% {ReportText.Percent(dd.Low)} to {ReportText.Percent(dd.High)}") : "no gold labels");
        Card("coherent accuracy", figures.CoherentAccuracy is { } c ? ReportText.Percent(c.Value) : "n/a",
            figures.CoherentAccuracy is { } cc ? string.Create(Invariant, $"{cc.Successes} of {cc.Total}; 95% {ReportText.Percent(cc.Low)} to {ReportText.Percent(cc.High)}") : "no gold labels");
        Card("overturn rate", ReportText.Percent(figures.OverturnRate));
        Card("contested rate", ReportText.Percent(figures.ContestedRate));
        Card("two-sided rate", ReportText.Percent(figures.TwoSidedRate));
        Card("mean margin", ReportText.Weight(figures.MeanMargin), $"normalised {ReportText.Weight(figures.MeanNormalisedMargin)}");
        if (figures.MeanStability is { } stability)
        {
            Card("mean stability", ReportText.Percent(stability), string.Create(Invariant, $"{figures.StabilityTies} tied"));
        }

        if (figures.PairedDirectAccuracy is { } paired)
        {
            Card("paired direct accuracy", ReportText.Percent(paired.Value), string.Create(Invariant, $"{paired.Successes} of {paired.Total}"));
        }

        Card("conflicting pairs", figures.ConflictingPairs.ToString(Invariant), string.Create(Invariant, $"{figures.CutOffDiscarded} cut-off explanations"));
        Card("links found", (figures.EntailmentLinks + figures.ContradictionLinks).ToString(Invariant),
            string.Create(Invariant, $"{figures.EntailmentLinks} entailment, {figures.ContradictionLinks} contradiction"));
        Card("model calls", figures.ModelCalls.ToString(Invariant), string.Create(Invariant, $"{figures.Tokens.Total} tokens"));
        Card("wall time", ReportText.Duration(figures.WallTime));
        html.Append("</dl>\n</section>\n");
    }

    private static void Gates(StringBuilder html, IReadOnlyList<GateResult> gates)
    {
        if (gates.Count == 0)
        {
            return;
        }

        html.Append("<section class=\"gates\">\n<h2>Gates</h2>\n<table>\n<thead><tr><th>gate</th><th>value</th><th>wanted</th><th>result</th></tr></thead>\n<tbody>\n");
        foreach (var gate in gates)
        {
            html.Append(Invariant, $"<tr class=\"{(gate.Passed ? "pass" : "fail")}\"><td>{E(gate.Name)}</td><td>{(gate.Value is { } v ? ReportText.Weight(v) : "n/a")}</td>")
                .Append(Invariant, $"<td>{E(gate.Comparison)} {ReportText.Weight(gate.Threshold)}</td><td>{(gate.Passed ? "pass" : "fail")}</td></tr>\n");
        }

        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private static void Completion(StringBuilder html, RunCompletion completion)
    {
        if (completion.IsComplete)
        {
            return;
        }

        html.Append("<section class=\"completion\">\n<h2>How the run ended</h2>\n");
        if (completion.StoppedBecause is { } reason)
        {
            html.Append("<p><strong>Stopped:</strong> ").Append(E(reason))
                .Append(Invariant, $"; {completion.NotJudged.Count} claim(s) not judged").Append("</p>\n");
        }

        if (completion.NotJudged.Count > 0)
        {
            html.Append("<details><summary>Claims not judged</summary><p>").Append(E(string.Join(", ", completion.NotJudged))).Append("</p></details>\n");
        }

        if (completion.Problems.Count > 0)
        {
            html.Append("<ul class=\"problems\">\n");
            foreach (var problem in completion.Problems)
            {
                html.Append("<li>").Append(E(problem.Message)).Append("</li>\n");
            }

            html.Append("</ul>\n");
        }

        html.Append("</section>\n");
    }

    private static void Filters(StringBuilder html, RunFigures figures)
    {
        html.Append("<section class=\"claims\">\n<h2>Claims</h2>\n<div class=\"filters\" role=\"search\">\n")
            .Append("<input id=\"filter-text\" type=\"search\" placeholder=\"Filter by id, claim or tag\" aria-label=\"Filter claims by text\">\n");
        foreach (var status in Statuses)
        {
            var count = status switch
            {
                ClaimStatus.Settled => figures.Settled,
                ClaimStatus.Overturned => figures.Overturned,
                ClaimStatus.Contested => figures.Contested,
                _ => figures.Failed,
            };
            var word = ReportWords.Of(status);
            html.Append(Invariant, $"<label class=\"chip {word}\"><input type=\"checkbox\" data-status-filter=\"{word}\" checked> {word} ({count})</label>\n");
        }

        html.Append(Invariant, $"<span class=\"shown\">showing <b id=\"shown\">{figures.Claims}</b> of {figures.Claims}</span>\n</div>\n")
            .Append("<table id=\"claim-table\">\n<thead><tr><th>id</th><th>claim</th><th>status</th><th>direct answer</th><th>answer</th><th>gold</th><th>margin</th></tr></thead>\n<tbody>\n");
    }

    private static StringBuilder Row(ClaimReport claim, int index)
    {
        var status = ReportWords.Of(claim.Status);
        var row = new StringBuilder();
        row.Append(Invariant, $"<tr data-claim data-status=\"{status}\" data-search=\"{E(Search(claim))}\">")
            .Append(Invariant, $"<td><a href=\"#claim-{index}\">{E(claim.Id)}</a></td><td>{E(ReportText.Shorten(ReportText.OneLine(claim.Text), 140))}</td>")
            .Append(Invariant, $"<td><span class=\"status {status}\">{status}</span></td><td>{ReportWords.Answer(claim.DirectAnswer)}</td>")
            .Append(Invariant, $"<td><b>{ReportWords.Answer(claim.Answer)}</b></td><td>{(claim.Gold is { } g ? ReportWords.Answer(g) : "")}</td>")
            .Append(Invariant, $"<td>{(claim.Status == ClaimStatus.Failed ? "" : ReportText.Weight(claim.Margin))}</td></tr>\n");
        return row;
    }

    private static StringBuilder Article(ClaimReport claim, int index, PairListing listing)
    {
        var status = ReportWords.Of(claim.Status);
        var html = new StringBuilder();
        html.Append(Invariant, $"<article class=\"claim\" id=\"claim-{index}\" data-claim data-status=\"{status}\" data-search=\"{E(Search(claim))}\">\n")
            .Append(Invariant, $"<h3><span class=\"status {status}\">{status}</span> <span class=\"id\">{E(claim.Id)}</span> {E(ReportText.OneLine(claim.Text))}</h3>\n")
            .Append(Invariant, $"<p class=\"verdict\">answer <b>{ReportWords.Answer(claim.Answer)}</b> &middot; direct answer {ReportWords.Answer(claim.DirectAnswer)}");
        if (claim.Gold is { } gold)
        {
            html.Append(" &middot; gold ").Append(ReportWords.Answer(gold));
        }

        if (claim.Status != ClaimStatus.Failed)
        {
            html.Append(" &middot; margin ").Append(ReportText.Weight(claim.Margin))
                .Append(" (normalised ").Append(ReportText.Weight(claim.NormalisedMargin)).Append(')');
            if (claim.Stability is { } stability)
            {
                html.Append(" &middot; ").Append(E(ReportText.Stability(stability)));
            }

            if (claim.PairedDirectAnswer is { } pairedAnswer)
            {
                html.Append(" &middot; paired direct answer ").Append(ReportWords.Answer(pairedAnswer));
            }
            if (claim.TwoSided)
            {
                html.Append(" &middot; two-sided");
            }
        }

        if (claim.Tags.Count > 0)
        {
            html.Append(" &middot; tags ").Append(E(string.Join(", ", claim.Tags)));
        }

        html.Append("</p>\n");
        if (claim.Error is { } error)
        {
            html.Append("<p class=\"reason\">").Append(E(error)).Append("</p>\n");
        }

        html.Append(TreeSvg.Draw(claim));
        if (claim.Deciding.Count > 0)
        {
            html.Append("<h4>Decided by</h4>\n<ul class=\"deciding\">\n");
            foreach (var clause in claim.Deciding.Take(6))
            {
                html.Append("<li>").Append(E(ReportText.Clause(clause, claim))).Append("</li>\n");
            }

            html.Append("</ul>\n");
        }

        if (claim.Conflicts.Count > 0)
        {
            html.Append("<h4>Conflicting readings</h4>\n<ul class=\"conflicts\">\n");
            foreach (var conflict in claim.Conflicts)
            {
                html.Append("<li>").Append(E(ReportText.Conflict(conflict))).Append("</li>\n");
            }

            html.Append("</ul>\n");
        }

        var pairs = listing == PairListing.All ? claim.Pairs : [.. claim.Pairs.Where(p => p.Linked)];
        if (pairs.Count > 0)
        {
            html.Append(listing == PairListing.All ? "<details><summary>All statement pairs</summary>\n" : "<details><summary>Linked pairs</summary>\n")
                .Append("<table class=\"pairs\"><thead><tr><th>pair</th><th>forward</th><th>backward</th></tr></thead><tbody>\n");
            foreach (var pair in pairs)
            {
                html.Append(Invariant, $"<tr><td>#{pair.First} &harr; #{pair.Second}</td><td>{E(Direction(pair.Forward))}</td><td>{E(Direction(pair.Backward))}</td></tr>\n");
            }

            html.Append("</tbody></table>\n</details>\n");
        }

        html.Append("</article>\n");
        return html;
    }

    private static string Direction(Core.Entailment.EntailmentScores s) =>
        $"{ReportWords.Label(s.Kind)} (e {ReportText.Probability(s.Entailment)}, n {ReportText.Probability(s.Neutral)}, c {ReportText.Probability(s.Contradiction)})";

    /// <summary>What the text filter matches: id, claim and tags, lower case.</summary>
    private static string Search(ClaimReport claim) =>
        string.Join(' ', [claim.Id, ReportText.OneLine(claim.Text), .. claim.Tags]).ToLowerInvariant();

    /// <summary>Text safe in element content and double-quoted attributes: the four characters that matter escaped, nothing else.</summary>
    internal static string E(string text) => text
        .Replace("&", "&amp;", StringComparison.Ordinal)
        .Replace("<", "&lt;", StringComparison.Ordinal)
        .Replace(">", "&gt;", StringComparison.Ordinal)
        .Replace("\"", "&quot;", StringComparison.Ordinal);
}
