namespace Plumbline.Core.Runs;

/// <summary>
/// McNemar's exact test on paired outcomes (common practice): of the pairs whose outcome differs between two runs,
/// <see cref="FirstOnly"/> went one way and <see cref="SecondOnly"/> the other. Under "no change" each such pair is a
/// fair coin, so the two-sided p-value is twice the binomial(n, 1/2) probability of a split at least as uneven as
/// the one seen, capped at 1. Concordant pairs carry no information about the change and do not enter.
/// </summary>
/// <param name="FirstOnly">Discordant pairs with the outcome in the first run only (for correctness: right before, wrong now).</param>
/// <param name="SecondOnly">Discordant pairs with the outcome in the second run only (wrong before, right now).</param>
/// <param name="PValue">Two-sided exact p-value.</param>
public sealed record McNemarTest(int FirstOnly, int SecondOnly, double PValue)
{
    public int Discordant => FirstOnly + SecondOnly;

    public static McNemarTest Of(int firstOnly, int secondOnly)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(firstOnly);
        ArgumentOutOfRangeException.ThrowIfNegative(secondOnly);
        return new McNemarTest(firstOnly, secondOnly, TwoSidedPValue(firstOnly, secondOnly));
    }

    /// <summary>
    /// min(1, 2 · Σ_{i=0..k} C(n, i) / 2^n) with n = b + c and k = min(b, c). The terms are summed relative to the
    /// largest one, C(n, k) / 2^n, taken in logarithms, so n in the thousands neither overflows nor underflows.
    /// </summary>
    public static double TwoSidedPValue(int b, int c)
    {
        var n = b + c;
        var k = Math.Min(b, c);
        if (n == 0 || 2 * k == n)
        {
            return 1.0;
        }

        // log C(n, k) - n log 2
        var logLargest = -n * Math.Log(2);
        for (var j = 1; j <= k; j++)
        {
            logLargest += Math.Log((double)(n - k + j) / j);
        }

        // C(n, i - 1) / C(n, i) = i / (n - i + 1): walk down from i = k.
        double sum = 1, term = 1;
        for (var i = k; i >= 1; i--)
        {
            term *= (double)i / (n - i + 1);
            sum += term;
        }

        return Math.Min(1.0, 2 * Math.Exp(logLargest + Math.Log(sum)));
    }
}
