using MathNet.Numerics.Distributions;
using Plumbline.Core.Runs;

namespace Plumbline.Core.Tests.Runs;

/// <summary>The Wilson interval and McNemar's exact test against outside references: Math.NET Numerics 5.0 and a published table.</summary>
public sealed class StatisticsReferenceTests
{
    /// <summary>
    /// Two-sided exact McNemar p-values from Math.NET Numerics' binomial distribution:
    /// min(1, 2 · Binomial(0.5, b + c).CDF(min(b, c))).
    /// </summary>
    [Theory]
    [InlineData(1, 9)]
    [InlineData(9, 1)]
    [InlineData(3, 12)]
    [InlineData(0, 5)]
    [InlineData(7, 7)]
    [InlineData(6, 7)]
    [InlineData(40, 62)]
    [InlineData(480, 530)]
    public void McNemar_PValue_MatchesMathNetBinomial(int b, int c)
    {
        var n = b + c;
        var expected = Math.Min(1.0, 2 * Binomial.CDF(0.5, n, Math.Min(b, c)));

        var test = McNemarTest.Of(b, c);

        Assert.Equal(expected, test.PValue, 1e-12);
        Assert.Equal((b, c, n), (test.FirstOnly, test.SecondOnly, test.Discordant));
    }

    [Fact]
    public void McNemar_OneAgainstNine_ByHand()
    {
        // 2 · (C(10,0) + C(10,1)) / 2^10 = 2 · 11 / 1024 = 0.021484375, exactly.
        Assert.Equal(0.021484375, McNemarTest.TwoSidedPValue(1, 9), 15);
    }

    [Fact]
    public void McNemar_NoDiscordantPairs_PIsOne() => Assert.Equal(1.0, McNemarTest.TwoSidedPValue(0, 0));

    [Fact]
    public void McNemar_ThousandsOfPairs_NeitherOverflowsNorUnderflows()
    {
        // 2000 against 2400: far out in the tail; Math.NET's CDF is the reference, and the value must stay positive.
        var expected = 2 * Binomial.CDF(0.5, 4400, 2000);

        var p = McNemarTest.TwoSidedPValue(2000, 2400);

        Assert.True(p > 0);
        Assert.Equal(1.0, p / expected, 9);
    }

    /// <summary>
    /// Wilson score intervals published by Newcombe (1998), "Two-sided confidence intervals for the single proportion:
    /// comparison of seven methods", Statistics in Medicine 17, 857-872, Table II, method 3 (score method without
    /// continuity correction). Quoted from memory; the next test checks the same bounds another way.
    /// </summary>
    [Theory]
    [InlineData(81, 263, 0.2553, 0.3662)]
    [InlineData(15, 148, 0.0624, 0.1605)]
    [InlineData(0, 20, 0.0000, 0.1611)]
    [InlineData(1, 29, 0.0061, 0.1718)]
    public void Wilson_NewcombeTable_Matches(int successes, int total, double low, double high)
    {
        var interval = Proportion.Wilson(successes, total);

        Assert.Equal(low, interval.Low, 4);
        Assert.Equal(high, interval.High, 4);
    }

    /// <summary>
    /// The Wilson interval is the set of p for which the score test does not reject (Wilson 1927): its ends solve
    /// (p̂ - p)² = z² p (1 - p) / n, with z the normal 97.5% quantile, here taken from Math.NET Numerics.
    /// </summary>
    [Theory]
    [InlineData(8, 10)]
    [InlineData(10, 12)]
    [InlineData(81, 263)]
    [InlineData(3, 1000)]
    public void Wilson_EndsSolveTheScoreEquation_WithMathNetQuantile(int successes, int total)
    {
        var z = Normal.InvCDF(0, 1, 0.975);
        var observed = (double)successes / total;
        var interval = Proportion.Wilson(successes, total, z);

        foreach (var end in new[] { interval.Low, interval.High })
        {
            var left = (observed - end) * (observed - end);
            var right = z * z * end * (1 - end) / total;
            Assert.Equal(left, right, 12);
        }

        Assert.Equal(Proportion.Z95, z, 9);
    }
}
