using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;

namespace Plumbline.Reports.Model;

/// <summary>Turns a verdict into what reports show: statements with their values and links, pairs once, the deciding clauses.</summary>
public static class ClaimReportBuilder
{
    public static ClaimReport From(Verdict verdict, PairListing listing = PairListing.Linked)
    {
        ArgumentNullException.ThrowIfNull(verdict);
        var claim = verdict.Claim;
        var statements = verdict.Tree?.Statements ?? [];
        var linksOf = verdict.Links
            .SelectMany(link => link.From == link.To ? [(Id: link.From, Link: link)] : new[] { (Id: link.From, Link: link), (Id: link.To, Link: link) })
            .ToLookup(x => x.Id, x => x.Link);

        var statementReports = statements.Select(s => new StatementReport(
            s.Id, s.Text, s.Negation, s.NegationFromModel, s.Depth, s.ParentId, s.GeneratedFor, s.Integrity,
            s.Belief, s.PTrue, s.PTrueOfNegation, s.Kept,
            s.Kept && verdict.Values.TryGetValue(s.Id, out var value) ? value : null,
            [.. linksOf[s.Id]])).ToList();

        return new ClaimReport(
            claim.Id,
            claim.Text,
            claim.Gold,
            claim.Tags,
            verdict.Answer,
            verdict.DirectAnswer,
            verdict.Status,
            verdict.Margin,
            verdict.TwoSided,
            verdict.ProbabilitiesEstimated,
            statementReports,
            verdict.Links,
            PairsOf(verdict, listing),
            verdict.Falsified,
            Deciding(verdict),
            verdict.SolveStatus,
            verdict.ObjectiveCost,
            verdict.IntegralCount,
            verdict.PrunedCount,
            verdict.ModelCalls,
            verdict.Tokens,
            verdict.Timings,
            verdict.Error)
        {
            PairedDirectAnswer = verdict.PairedDirectAnswer,
            NormalisedMargin = verdict.NormalisedMargin,
            Conflicts = verdict.Conflicts,
            CutOffDiscarded = verdict.CutOffDiscarded,
            Stability = verdict.Stability,
        };
    }

    /// <summary>
    /// Each unordered pair whose two directions were both scored, once, lower id first. With
    /// <see cref="PairListing.Linked"/> only pairs with a link in either direction.
    /// </summary>
    internal static List<PairReport> PairsOf(Verdict verdict, PairListing listing)
    {
        var scores = new Dictionary<(int, int), EntailmentScores>(verdict.Pairs.Count);
        foreach (var pair in verdict.Pairs)
        {
            scores[(pair.From, pair.To)] = pair.Scores;
        }

        var linked = verdict.Links.Select(l => (Math.Min(l.From, l.To), Math.Max(l.From, l.To))).ToHashSet();
        var pairs = new List<PairReport>();
        foreach (var ((from, to), forward) in scores.OrderBy(e => Math.Min(e.Key.Item1, e.Key.Item2)).ThenBy(e => Math.Max(e.Key.Item1, e.Key.Item2)))
        {
            if (from >= to || !scores.TryGetValue((to, from), out var backward))
            {
                continue;
            }

            var isLinked = linked.Contains((from, to));
            if (isLinked || listing == PairListing.All)
            {
                pairs.Add(new PairReport(from, to, forward, backward, isLinked));
            }
        }

        return pairs;
    }

    /// <summary>Clauses the other answer's best assignment breaks and the optimum keeps, heaviest first.</summary>
    internal static List<FalsifiedClause> Deciding(Verdict verdict)
    {
        var broken = verdict.Falsified.Select(c => c.Index).ToHashSet();
        return [.. verdict.FalsifiedWithOtherAnswer
            .Where(c => !broken.Contains(c.Index))
            .OrderByDescending(c => c.Weight)
            .ThenBy(c => c.Index)];
    }
}
