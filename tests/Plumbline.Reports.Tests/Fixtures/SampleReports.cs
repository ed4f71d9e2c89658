using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.Core.Trees;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Tests.Fixtures;

/// <summary>
/// Hand-built, invented run results that every writer test renders: a settled claim with a gold
/// label, an overturned one, and one that failed. Values are chosen to exercise rounding
/// (0.987654, 1.23456) and the UTC conversion of a +02:00 clock.
/// </summary>
public static class SampleReports
{
    public const string LongStatement =
        "Glass is a liquid that flows so slowly that old window panes are visibly thicker at the bottom than at the top.";

    public static DateTimeOffset Started { get; } = new(2025, 3, 1, 10, 30, 0, TimeSpan.FromHours(2));

    public static RunSettings Settings { get; } = RunSettings.From(
        CoherenceOptions.Default,
        modelSource: "recording: demo.jsonl (tiny-demo-model)",
        nliModel: "plumb-nli-small sha256:0123abcd",
        solver: "cp-sat 9.15",
        seed: 7);

    /// <summary>
    /// Claim true, #1 true, #2 false in the optimum. Links #1 entails #0 (0.912345) and #2 contradicts #0 (0.987654);
    /// the reverse direction #0 -> #2 also scores contradiction (0.91) but is not in the link list. The best
    /// assignment with the claim false breaks "#1 entails #0" (index 2) and "belief: #2" (index 4); the optimum
    /// breaks only "belief: #2", so "#1 entails #0" alone decided the answer.
    /// </summary>
    public static Verdict Settled { get; } = new(
        new Claim("c1", "Water boils at 100 degrees Celsius at sea level.", Gold: true, Tags: ["physics", "easy"]),
        Answer: true,
        DirectAnswer: true,
        ClaimStatus.Settled,
        Margin: 1.23456,
        TwoSided: true,
        new ExplanationTree(
        [
            Root("Water boils at 100 degrees Celsius at sea level.", 0.91, 0.07, Integrity.IntegralTrue),
            Child(1, "At sea level the air pressure is one atmosphere.", parent: 0, forAnswer: true, 0.95, 0.03, Integrity.IntegralTrue, kept: true),
            Child(2, "Water boils at 90 degrees Celsius at sea level.", parent: 0, forAnswer: false, 0.12, 0.8, Integrity.IntegralFalse, kept: true),
            Child(3, "Boiling points never depend on pressure.", parent: 0, forAnswer: false, 0.6, 0.55, Integrity.NotIntegral, kept: false),
        ]),
        [
            new Link(1, 0, EntailmentKind.Entailment, 0.912345),
            new Link(2, 0, EntailmentKind.Contradiction, 0.987654),
        ],
        [new FalsifiedClause(4, ClauseOrigin.Belief(2), [-3], 0.13043)],
        SolveStatus.Optimal,
        ObjectiveCost: 130,
        IntegralCount: 3,
        PrunedCount: 1,
        ModelCalls: 14,
        new TokenUsage(900, 210),
        ProbabilitiesEstimated: false,
        new VerdictTimings(TimeSpan.FromMilliseconds(812.34), TimeSpan.FromMilliseconds(40.06), TimeSpan.FromMilliseconds(3.3)))
    {
        Pairs =
        [
            new PairScore(0, 1, new EntailmentScores(0.2, 0.7, 0.1)),
            new PairScore(0, 2, new EntailmentScores(0.04, 0.05, 0.91)),
            new PairScore(1, 0, new EntailmentScores(0.912345, 0.08, 0.007655)),
            new PairScore(1, 2, new EntailmentScores(0.1, 0.8, 0.1)),
            new PairScore(2, 0, new EntailmentScores(0.002346, 0.01, 0.987654)),
            new PairScore(2, 1, new EntailmentScores(0.15, 0.7, 0.15)),
        ],
        Values = new Dictionary<int, bool> { [0] = true, [1] = true, [2] = false },
        // Soft clauses weigh 4.0 in all (say), so the normalised margin is 1.23456 / 4.0.
        NormalisedMargin = 0.30864,
        PairedDirectAnswer = true,
        Stability = new SampleAgreement(Trees: 3, Agreeing: 2, Tied: false),
        CutOffDiscarded = 1,
        FalsifiedWithOtherAnswer =
        [
            new FalsifiedClause(2, ClauseOrigin.Entails(1, 0), [-2, 1], 1.0),
            new FalsifiedClause(4, ClauseOrigin.Belief(2), [-3], 0.13043),
        ],
    };

    public static Verdict Overturned { get; } = new(
        new Claim("c2", "Glass is a liquid.", Gold: false),
        Answer: false,
        DirectAnswer: true,
        ClaimStatus.Overturned,
        Margin: 0.5,
        TwoSided: false,
        new ExplanationTree(
        [
            Root("Glass is a liquid.", 0.55, 0.5, Integrity.NotIntegral),
            Child(1, LongStatement, parent: 0, forAnswer: true, 0.3, 0.7, Integrity.IntegralFalse, kept: true),
            Child(2, "Glass is an amorphous solid.", parent: 0, forAnswer: false, 0.97, 0.02, Integrity.IntegralTrue, kept: true),
        ]),
        [new Link(2, 0, EntailmentKind.Contradiction, 0.95), new Link(1, 2, EntailmentKind.Contradiction, 0.93)],
        [],
        SolveStatus.Optimal,
        ObjectiveCost: 612,
        IntegralCount: 2,
        PrunedCount: 0,
        ModelCalls: 11,
        new TokenUsage(700, 160),
        ProbabilitiesEstimated: true,
        new VerdictTimings(TimeSpan.FromMilliseconds(640), TimeSpan.FromMilliseconds(22.5), TimeSpan.FromMilliseconds(2)))
    {
        Pairs =
        [
            new PairScore(0, 1, new EntailmentScores(0.61, 0.3, 0.09)),
            new PairScore(0, 2, new EntailmentScores(0.05, 0.1, 0.85)),
            new PairScore(1, 0, new EntailmentScores(0.1, 0.33, 0.57)),
            new PairScore(1, 2, new EntailmentScores(0.02, 0.05, 0.93)),
            new PairScore(2, 0, new EntailmentScores(0.02, 0.03, 0.95)),
            new PairScore(2, 1, new EntailmentScores(0.1, 0.5, 0.4)),
        ],
        Values = new Dictionary<int, bool> { [0] = false, [1] = false, [2] = true },
        NormalisedMargin = 0.125,
        PairedDirectAnswer = false,
        // #0 -> #1 reads entailment, #1 -> #0 contradiction: a conflict, dropped, so the pair has no link.
        Conflicts = [new LinkConflict(new Link(0, 1, EntailmentKind.Entailment, 0.61), new Link(1, 0, EntailmentKind.Contradiction, 0.57), Dropped: true)],
    };

    public const string FailureReason = "claim c3: building the explanation tree failed: backend answered HTTP 503";

    public static Verdict Failed { get; } = Verdict.Failed(
        new Claim("c3", "The moon is made of cheese.", Gold: false),
        FailureReason,
        modelCalls: 2,
        tokens: new TokenUsage(40, 0),
        timings: new VerdictTimings(TimeSpan.FromMilliseconds(120), TimeSpan.Zero, TimeSpan.Zero));

    /// <summary>Settled (gold true), overturned (gold false), failed: direct accuracy 1 of 2, coherent 2 of 2.</summary>
    public static RunReport Mixed() => Report([Settled, Overturned, Failed], Started.AddSeconds(4.5));

    /// <summary>The same run with the gold labels removed, so no accuracy can be computed.</summary>
    public static RunReport WithoutGold() =>
        Report([.. new[] { Settled, Overturned, Failed }.Select(v => v with { Claim = v.Claim with { Gold = null } })], Started.AddMilliseconds(350));

    /// <summary>A finished report of <paramref name="verdicts"/>, figures folded from them, claims in memory.</summary>
    public static RunReport Report(
        IReadOnlyList<Verdict> verdicts,
        DateTimeOffset finished,
        PairListing listing = PairListing.Linked,
        RunCompletion? completion = null,
        IReadOnlyList<GateResult>? gates = null) =>
        new(
            RunHeader.Create("0.1.0", Settings, Started, listing),
            finished,
            RunFigures.From(verdicts, finished - Started),
            gates ?? [],
            completion ?? RunCompletion.Complete,
            new ClaimReportList([.. verdicts.Select(v => ClaimReportBuilder.From(v, listing))]));

    private static Statement Root(string text, double pTrue, double pNegation, Integrity integrity) =>
        new(0, text, "It is not true that " + text, false, 0, null, null, pTrue, pNegation, integrity,
            Statement.BeliefOf(pTrue, pNegation), true);

    private static Statement Child(int id, string text, int parent, bool forAnswer, double pTrue, double pNegation, Integrity integrity, bool kept) =>
        new(id, text, "It is not the case that " + text, true, 1, parent, forAnswer, pTrue, pNegation, integrity,
            Statement.BeliefOf(pTrue, pNegation), kept);
}
