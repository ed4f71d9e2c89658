namespace Plumbline.Nli.Evaluation;

/// <summary>
/// Expected calibration error: pairs grouped by the probability of their predicted class into equal-width bins,
/// then the pair-weighted mean gap between each bin's accuracy and its mean probability. Fifteen bins is the
/// usual choice in the calibration literature (common practice).
/// </summary>
public static class CalibrationBins
{
    public const int DefaultBins = 15;

    public static double ExpectedCalibrationError(IReadOnlyList<(double Confidence, bool Correct)> predictions, int bins = DefaultBins)
    {
        ArgumentNullException.ThrowIfNull(predictions);
        ArgumentOutOfRangeException.ThrowIfLessThan(bins, 1);
        if (predictions.Count == 0)
        {
            return 0;
        }

        var count = new int[bins];
        var confidence = new double[bins];
        var correct = new int[bins];
        foreach (var (p, ok) in predictions)
        {
            // Bins are (k/B, (k+1)/B]; a probability of exactly 0 joins the first.
            var bin = Math.Clamp((int)Math.Ceiling(p * bins) - 1, 0, bins - 1);
            count[bin]++;
            confidence[bin] += p;
            correct[bin] += ok ? 1 : 0;
        }

        var error = 0.0;
        for (var b = 0; b < bins; b++)
        {
            if (count[b] > 0)
            {
                error += Math.Abs(((double)correct[b] / count[b]) - (confidence[b] / count[b])) * count[b];
            }
        }

        return error / predictions.Count;
    }
}
