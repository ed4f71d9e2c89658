using Plumbline.Nli.Evaluation;

namespace Plumbline.Nli.Tests.Evaluation;

public sealed class CalibrationBinsTests
{
    [Fact]
    public void ExpectedCalibrationError_TwoBinsByHand_IsWeightedMeanGap()
    {
        // Bins of width 1/15, each (k/15, (k+1)/15]. 0.95 and 0.97 share the last bin: accuracy 1/2, mean
        // confidence 0.96, gap 0.46. 0.40 tops the bin (0.333, 0.4]: wrong, gap 0.40. 0.41 sits in (0.4, 0.467]:
        // right, gap 0.59. Weighted by pairs: (0.40 + 0.59 + 2 * 0.46) / 4 = 0.4775.
        var error = CalibrationBins.ExpectedCalibrationError([(0.95, true), (0.97, false), (0.40, false), (0.41, true)]);

        Assert.Equal(0.4775, error, 12);
    }

    [Fact]
    public void ExpectedCalibrationError_PerfectlyCalibratedBins_IsZero()
    {
        // Four pairs at 0.75, three of them right: the bin's accuracy equals its confidence.
        var error = CalibrationBins.ExpectedCalibrationError([(0.75, true), (0.75, true), (0.75, true), (0.75, false)]);

        Assert.Equal(0.0, error, 12);
    }

    [Fact]
    public void ExpectedCalibrationError_NoPredictions_IsZero() =>
        Assert.Equal(0.0, CalibrationBins.ExpectedCalibrationError([]));
}
