namespace Plumbline.Benchmarks;

/// <summary>Order statistics of a set of measured durations, in milliseconds.</summary>
internal sealed record Timing(double Median, double P90, double Min, double Max, double Mean)
{
    public static Timing Of(IReadOnlyCollection<TimeSpan> samples)
    {
        if (samples.Count == 0)
        {
            throw new ArgumentException("no samples", nameof(samples));
        }

        var sorted = samples.Select(s => s.TotalMilliseconds).Order().ToArray();
        var middle = sorted.Length / 2;
        var median = sorted.Length % 2 == 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
        // Nearest-rank percentile: the smallest sample with at least 90% of samples at or below it.
        var p90 = sorted[(int)Math.Ceiling(0.9 * sorted.Length) - 1];
        return new Timing(median, p90, sorted[0], sorted[^1], sorted.Average());
    }

    public override string ToString() =>
        FormattableString.Invariant($"median {Median:0.00} ms, p90 {P90:0.00} ms (min {Min:0.00}, mean {Mean:0.00}, max {Max:0.00})");
}
