using System.Globalization;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Reports;

/// <summary>Spellings the human-readable formats (text, Markdown, HTML, JUnit) share, so they never disagree.</summary>
internal static class ReportText
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    public static string Percent(double share) => (share * 100).ToString("0.0", Invariant) + "%";

    public static string Probability(double p) => ReportNumbers.Round(p, "probability").ToString("0.00##", Invariant);

    public static string Weight(double weight) => ReportNumbers.Round(weight, "weight").ToString("0.0###", Invariant);

    public static string Belief(double belief) => ReportNumbers.Round(belief, "belief").ToString("0.00", Invariant);

    public static string Duration(TimeSpan span) => span.TotalSeconds < 1
        ? ReportNumbers.Milliseconds(span).ToString("0.#", Invariant) + " ms"
        : span.TotalSeconds.ToString("0.0", Invariant) + " s";

    public static string Count(int n, string noun) => n == 1 ? $"1 {noun}" : string.Create(Invariant, $"{n} {noun}s");

    public static string Accuracy(Proportion p) =>
        string.Create(Invariant, $"{Percent(p.Value)} ({p.Successes} of {p.Total}; Wilson 95% interval {Percent(p.Low)} to {Percent(p.High)})");

    /// <summary>Model text can hold line breaks; a line of a report keeps one line per fact.</summary>
    public static string OneLine(string text) =>
        string.Join(' ', text.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries));

    public static string Shorten(string text, int length) =>
        text.Length <= length ? text : string.Concat(text.AsSpan(0, length - 1).TrimEnd(), "\u2026");

    /// <summary>"T" or "F" for a statement's value in the optimum, "-" when it has none (pruned, failed).</summary>
    public static string Value(bool? value) => value switch
    {
        true => "T",
        false => "F",
        null => "-",
    };

    /// <summary>"#2 contradicts #0 (p 0.95)", "belief in #3", from a deciding or falsified clause and the claim's links.</summary>
    public static string Clause(FalsifiedClause clause, ClaimReport claim)
    {
        var origin = clause.Origin;
        var weight = Weight(clause.Weight);
        if (origin.Kind == ClauseKind.Belief)
        {
            var held = claim.Statement(origin.Statement)?.Integrity == Core.Trees.Integrity.IntegralFalse ? "false" : "true";
            return string.Create(Invariant, $"belief that #{origin.Statement} is {held} (weight {weight})");
        }

        var link = claim.Links.FirstOrDefault(l => l.From == origin.Statement && l.To == origin.Other);
        var probability = link is null ? "" : $", p {Probability(link.Probability)}";
        return string.Create(Invariant, $"{origin} (weight {weight}{probability})");
    }

    /// <summary>"#0 ~ #2 contradiction, p 0.95 / 0.91" style line for one pair, both directions.</summary>
    public static string Pair(PairReport pair)
    {
        string Direction(EntailmentScores s) => $"{ReportWords.Label(s.Kind)} {Probability(s.ProbabilityOf(s.Kind))}";
        return string.Create(Invariant,
            $"#{pair.First} -> #{pair.Second}: {Direction(pair.Forward)}; #{pair.Second} -> #{pair.First}: {Direction(pair.Backward)}");
    }

    /// <summary>"3 of 3 trees agree", "2 of 4 trees agree (tied)"; empty when one tree was judged.</summary>
    public static string Stability(SampleAgreement? stability) => stability is { } s
        ? string.Create(Invariant, $"{s.Agreeing} of {s.Trees} trees agree") + (s.Tied ? " (tied)" : "")
        : "";

    /// <summary>"#1 -> #2 entailment 0.81 against #2 -> #1 contradiction 0.72 (dropped)".</summary>
    public static string Conflict(LinkConflict conflict) => string.Create(Invariant,
        $"#{conflict.Entailment.From} -> #{conflict.Entailment.To} entailment {Probability(conflict.Entailment.Probability)} against ")
        + string.Create(Invariant, $"#{conflict.Contradiction.From} -> #{conflict.Contradiction.To} contradiction {Probability(conflict.Contradiction.Probability)}")
        + (conflict.Dropped ? " (both dropped)" : " (both kept)");

    /// <summary>Why a claim fails a JUnit test case or stands out in Markdown, given the chosen conditions.</summary>
    public static string Headline(ClaimReport claim) => claim.Status switch
    {
        ClaimStatus.Failed => "failed: " + OneLine(claim.Error ?? "no reason given"),
        _ => string.Create(Invariant,
            $"{ReportWords.Of(claim.Status)}: answer {ReportWords.Answer(claim.Answer)}, direct answer {ReportWords.Answer(claim.DirectAnswer)}")
            + (claim.Gold is { } gold ? $", gold {ReportWords.Answer(gold)}" : "")
            + $", margin {Weight(claim.Margin)} (normalised {Weight(claim.NormalisedMargin)})"
            + (claim.Stability is { } stability ? ", " + Stability(stability) : ""),
    };
}
