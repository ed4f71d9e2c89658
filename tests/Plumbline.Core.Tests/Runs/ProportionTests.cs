using Plumbline.Core.Runs;

namespace Plumbline.Core.Tests.Runs;

public sealed class ProportionTests
{
    [Fact]
    public void Wilson_EightOfTen_MatchesHandComputation()
    {
        // Computed by hand from the Wilson score formula (common practice), z = 1.96:
        // centre = (0.8 + 0.19207) / 1.38415 = 0.71673; half-width = 1.96 * sqrt(0.016 + 0.0096037) / 1.38415 = 0.22658.
        var interval = Proportion.Wilson(8, 10);

        Assert.Equal(0.8, interval.Value, 12);
        Assert.Equal(0.4902, interval.Low, 4);
        Assert.Equal(0.9433, interval.High, 4);
    }

    [Fact]
    public void Wilson_NoSuccesses_UpperBoundIsZSquaredOverNPlusZSquared()
    {
        // With p = 0 the formula reduces to [0, z^2 / (n + z^2)] (common practice).
        const double z2 = Proportion.Z95 * Proportion.Z95;

        var interval = Proportion.Wilson(0, 5);

        Assert.Equal(0.0, interval.Low, 12);
        Assert.Equal(z2 / (5 + z2), interval.High, 12);
    }

    [Fact]
    public void Wilson_AllSuccesses_MirrorsNoSuccesses()
    {
        var none = Proportion.Wilson(0, 7);
        var all = Proportion.Wilson(7, 7);

        Assert.Equal(1 - none.High, all.Low, 12);
        Assert.Equal(1.0, all.High, 12);
    }

    [Fact]
    public void Wilson_NoTrials_WholeRange() =>
        Assert.Equal(new Proportion(0, 0, 0.0, 0.0, 1.0), Proportion.Wilson(0, 0));

    [Fact]
    public void Wilson_MoreSuccessesThanTrials_Throws() =>
        Assert.Throws<ArgumentOutOfRangeException>(() => Proportion.Wilson(3, 2));
}
