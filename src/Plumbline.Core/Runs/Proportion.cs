namespace Plumbline.Core.Runs;

/// <summary>A share of successes with its Wilson 95% score interval.</summary>
public sealed record Proportion(int Successes, int Total, double Value, double Low, double High)
{
    /// <summary>z for a two-sided 95% interval (common practice).</summary>
    public const double Z95 = 1.959963984540054;

    /// <summary>
    /// Wilson score interval (common practice): centre (p + z²/2n) / (1 + z²/n), half-width
    /// z·sqrt(p(1-p)/n + z²/4n²) / (1 + z²/n). It stays inside [0, 1] and behaves at p = 0 or 1,
    /// where the plain normal interval collapses. With no trials the interval is [0, 1].
    /// </summary>
    public static Proportion Wilson(int successes, int total, double z = Z95)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(total);
        ArgumentOutOfRangeException.ThrowIfNegative(successes);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(successes, total);
        if (total == 0)
        {
            return new Proportion(0, 0, 0.0, 0.0, 1.0);
        }

        double n = total, p = successes / n, z2 = z * z;
        var denominator = 1 + z2 / n;
        var centre = (p + z2 / (2 * n)) / denominator;
        var half = z * Math.Sqrt(p * (1 - p) / n + z2 / (4 * n * n)) / denominator;
        return new Proportion(successes, total, p, Math.Max(0.0, centre - half), Math.Min(1.0, centre + half));
    }
}
