using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;

namespace Plumbline.Core.Tests.Runs;

public sealed class GateTests
{
    private static Verdict Judged(string id, bool? gold, bool answer, ClaimStatus status, double margin) =>
        new(new Claim(id, "text", gold), answer, answer, status, margin, false, null, [], [], SolveStatus.Optimal, 0, 1, 0, 1,
            TokenUsage.None, false, VerdictTimings.None);

    /// <summary>Five labelled claims, four answered as gold says: coherent accuracy 4/5 = 0.8 exactly; one overturned of five.</summary>
    private static RunFigures FourOfFive() => RunFigures.From(
    [
        Judged("a", true, true, ClaimStatus.Settled, 1.0),
        Judged("b", false, false, ClaimStatus.Settled, 0.5),
        Judged("c", true, true, ClaimStatus.Overturned, 0.25),
        Judged("d", true, true, ClaimStatus.Settled, 0.25),
        Judged("e", true, false, ClaimStatus.Contested, 0.0),
    ], TimeSpan.Zero);

    [Theory]
    [InlineData("min_coherent_accuracy", 0.8, true)]    // 4/5 is exactly the threshold: met
    [InlineData("min_coherent_accuracy", 0.8001, false)]
    [InlineData("max_overturn_rate", 0.2, true)]        // 1/5 exactly
    [InlineData("max_overturn_rate", 0.1999, false)]
    [InlineData("max_contested_rate", 0.2, true)]
    [InlineData("min_mean_margin", 0.4, true)]          // (1 + 0.5 + 0.25 + 0.25 + 0) / 5 = 0.4 exactly
    [InlineData("min_mean_margin", 0.41, false)]
    [InlineData("max_failed", 0, true)]
    public void Check_ThresholdExactlyMet_Passes(string name, double threshold, bool passes)
    {
        var result = Gate.Named(name, threshold)!.Check(FourOfFive());

        Assert.Equal(passes, result.Passed);
        Assert.Equal(name, result.Name);
        Assert.Equal(threshold, result.Threshold);
    }

    [Fact]
    public void Check_CoherentLowerBound_IsTheWilsonLowEnd()
    {
        // Wilson 95% interval of 4 of 5, by hand from the score formula (common practice), z = 1.96:
        // centre (0.8 + 0.38415) / 1.76829 = 0.66967; half-width 1.96 * sqrt(0.032 + 0.038415) / 1.76829 = 0.29414; low 0.3755.
        var result = Gate.Named("min_coherent_lower_bound", 0.37)!.Check(FourOfFive());

        Assert.Equal(0.3755, result.Value!.Value, 4);
        Assert.True(result.Passed);
        Assert.False(Gate.Named("min_coherent_lower_bound", 0.38)!.Check(FourOfFive()).Passed);
    }

    [Theory]
    [InlineData("min_coherent_accuracy")]
    [InlineData("min_coherent_lower_bound")]
    [InlineData("min_direct_accuracy")]
    public void Check_NoGoldLabels_AccuracyGateFailsWithNoValue(string name)
    {
        var figures = RunFigures.From([Judged("a", null, true, ClaimStatus.Settled, 1.0)], TimeSpan.Zero);

        var result = Gate.Named(name, 0.0)!.Check(figures);

        Assert.Null(result.Value);
        Assert.False(result.Passed);
    }

    [Theory]
    [InlineData("max_overturn_rate", 1.0)]
    [InlineData("max_contested_rate", 1.0)]
    [InlineData("min_mean_margin", 0.0)]
    [InlineData("min_coherent_accuracy", 0.0)]
    public void Check_ZeroJudgedClaims_FiguresOverNothingFail(string name, double loosest)
    {
        // Every claim failed: rates over judged claims are 0/0, which must not read as "no overturns".
        var figures = RunFigures.From([Verdict.Failed(new Claim("a", "text", true), "broken")], TimeSpan.Zero);

        var result = Gate.Named(name, loosest)!.Check(figures);

        Assert.Null(result.Value);
        Assert.False(result.Passed);
    }

    [Fact]
    public void Check_ZeroJudgedClaims_FailedCountStillKnown()
    {
        var figures = RunFigures.From([Verdict.Failed(new Claim("a", "text"), "broken"), Verdict.Failed(new Claim("b", "text"), "broken")], TimeSpan.Zero);

        Assert.Equal((2.0, false), (Gate.Named("max_failed", 1)!.Check(figures).Value!.Value, Gate.Named("max_failed", 1)!.Check(figures).Passed));
        Assert.True(Gate.Named("max_failed", 2)!.Check(figures).Passed);
    }

    [Fact]
    public void Check_MeanMarginOneRoundingStepShort_StillMeetsIt()
    {
        // In IEEE doubles 0.1 + 0.7 = 0.7999999999999999, so the mean of the margins 0.1 and 0.7 comes out one
        // rounding step under 0.4 (checked with Python's float arithmetic, which is the same IEEE 754 binary64).
        var figures = RunFigures.From(
        [
            Judged("a", null, true, ClaimStatus.Settled, 0.1),
            Judged("b", null, true, ClaimStatus.Settled, 0.7),
        ], TimeSpan.Zero);

        Assert.True(figures.MeanMargin < 0.4);
        Assert.True(Gate.Named("min_mean_margin", 0.4)!.Check(figures).Passed);
    }

    [Fact]
    public void Named_UnknownName_Null() => Assert.Null(Gate.Named("min_happiness", 1));

    [Fact]
    public void Names_MinAndMaxComparisons()
    {
        Assert.Equal(
            ["min_coherent_accuracy", "min_coherent_lower_bound", "min_direct_accuracy", "max_overturn_rate", "max_contested_rate", "max_failed", "min_mean_margin"],
            Gate.Names);
        Assert.All(Gate.Names, n => Assert.Equal(n.StartsWith("min_", StringComparison.Ordinal) ? ">=" : "<=", Gate.Named(n, 0)!.Comparison));
    }
}
