using System.Text.Json;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Tests.Runs;

public sealed class RunFiguresTests
{
    private static Verdict Judged(string id, bool? gold, bool direct, bool answer, ClaimStatus status, double margin, bool twoSided, params EntailmentKind[] links) =>
        new(new Claim(id, "text", gold), answer, direct, status, margin, twoSided, null,
            [.. links.Select(k => new Link(0, 1, k, 0.9))], [], SolveStatus.Optimal, 0, 1, 0, 10,
            new TokenUsage(100, 10), false, VerdictTimings.None);

    private static readonly Verdict[] Verdicts =
    [
        Judged("a", true, direct: true, answer: true, ClaimStatus.Settled, 2.0, twoSided: false, EntailmentKind.Entailment),
        Judged("b", false, direct: true, answer: false, ClaimStatus.Overturned, 1.0, twoSided: true, EntailmentKind.Contradiction, EntailmentKind.Entailment),
        Judged("c", true, direct: false, answer: false, ClaimStatus.Contested, 0.0, twoSided: true),
        Judged("d", null, direct: true, answer: true, ClaimStatus.Settled, 3.0, twoSided: false),
        Verdict.Failed(new Claim("e", "text", true), "claim e: broken", modelCalls: 4, tokens: new TokenUsage(7, 3)),
    ];

    [Fact]
    public void From_MixedVerdicts_CountsAndRates()
    {
        var figures = RunFigures.From(Verdicts, TimeSpan.FromSeconds(12));

        Assert.Equal((5, 4, 2, 1, 1, 1, 3), (figures.Claims, figures.Judged, figures.Settled, figures.Overturned, figures.Contested, figures.Failed, figures.Labelled));
        // Direct: a right, b wrong, c wrong -> 1/3; coherent: a, b right, c wrong -> 2/3.
        Assert.Equal((1, 3), (figures.DirectAccuracy!.Successes, figures.DirectAccuracy.Total));
        Assert.Equal((2, 3), (figures.CoherentAccuracy!.Successes, figures.CoherentAccuracy.Total));
        Assert.Equal(Proportion.Wilson(2, 3), figures.CoherentAccuracy);
        Assert.Equal(0.25, figures.OverturnRate);
        Assert.Equal(0.25, figures.ContestedRate);
        Assert.Equal(0.5, figures.TwoSidedRate);
        Assert.Equal(1.5, figures.MeanMargin);
        Assert.Equal((2, 1), (figures.EntailmentLinks, figures.ContradictionLinks));
        Assert.Equal(44, figures.ModelCalls);
        Assert.Equal(new TokenUsage(407, 43), figures.Tokens);
        Assert.Equal(TimeSpan.FromSeconds(12), figures.WallTime);
    }

    [Fact]
    public void From_NewPerClaimFields_FoldedByHand()
    {
        var conflict = new LinkConflict(new Link(1, 2, EntailmentKind.Entailment, 0.6), new Link(2, 1, EntailmentKind.Contradiction, 0.7), Dropped: true);
        Verdict[] verdicts =
        [
            Verdicts[0] with { PairedDirectAnswer = false, NormalisedMargin = 0.5, Stability = new SampleAgreement(3, 3, false), CutOffDiscarded = 2, Conflicts = [conflict] },
            Verdicts[1] with { PairedDirectAnswer = false, NormalisedMargin = 0.1, Stability = new SampleAgreement(3, 2, false), ProbabilitiesEstimated = true },
            Verdicts[2] with { PairedDirectAnswer = true, NormalisedMargin = 0.0, Stability = new SampleAgreement(2, 1, true), CutOffDiscarded = 1 },
            Verdicts[4],
        ];

        var figures = RunFigures.From(verdicts, TimeSpan.Zero);

        // Paired direct answers against gold (a true, b false, c true): false wrong, false right, true right.
        Assert.Equal((2, 3), (figures.PairedDirectAccuracy!.Successes, figures.PairedDirectAccuracy.Total));
        Assert.Equal(0.2, figures.MeanNormalisedMargin, 12);
        Assert.Equal((1.0 + 2.0 / 3 + 0.5) / 3, figures.MeanStability!.Value, 12);
        Assert.Equal(1, figures.StabilityTies);
        Assert.Equal((1, 3, 1), (figures.ConflictingPairs, figures.CutOffDiscarded, figures.EstimatedClaims));
    }

    [Fact]
    public void From_OneTreePerClaim_NoMeanStability() =>
        Assert.Null(RunFigures.From(Verdicts, TimeSpan.Zero).MeanStability);

    [Fact]
    public void From_NoLabels_NoAccuracy()
    {
        var figures = RunFigures.From([Verdicts[3]], TimeSpan.Zero);

        Assert.Null(figures.DirectAccuracy);
        Assert.Null(figures.CoherentAccuracy);
    }

    [Fact]
    public void From_Empty_ZeroRates()
    {
        var figures = RunFigures.From([], TimeSpan.Zero);

        Assert.Equal((0, 0.0, 0.0), (figures.Claims, figures.OverturnRate, figures.MeanMargin));
    }

    [Fact]
    public void Tally_AddedOneByOne_SameFiguresAsTheList()
    {
        var tally = new RunTally();
        foreach (var verdict in Verdicts)
        {
            tally.Add(verdict);
        }

        Assert.Equal(RunFigures.From(Verdicts, TimeSpan.FromSeconds(9)), tally.ToFigures(TimeSpan.FromSeconds(9)));
        Assert.Equal((Verdicts.Length, Verdicts.Count(v => v.IsFailed)), (tally.Claims, tally.Failed));
    }

    [Fact]
    public void Serialize_Verdict_LeavesOutProblemAndDerivedViews()
    {
        var tree = new ExplanationTree([new Statement(0, "C", "Not C", true, 0, null, null, 0.6, 0.3, Integrity.IntegralTrue, 2.0 / 3, true)]);
        var problem = new CoherenceProblem(new MaxSatProblem(1, [WeightedClause.Soft(667, 1)]), [ClauseOrigin.Belief(0)], [0], 1000);
        var verdict = Verdicts[0] with { Tree = tree, Problem = problem };

        var json = JsonSerializer.Serialize(verdict);

        Assert.DoesNotContain("\"Problem\"", json, StringComparison.Ordinal);
        Assert.DoesNotContain("\"Root\"", json, StringComparison.Ordinal);
        Assert.DoesNotContain("\"Kept\":[", json, StringComparison.Ordinal);
        Assert.DoesNotContain("\"IsIntegral\"", json, StringComparison.Ordinal);
        Assert.Contains("\"Statements\":[", json, StringComparison.Ordinal);
    }
}
