using System.Globalization;

namespace Plumbline.Reports;

/// <summary>
/// One rounding and spelling policy for every format. Probabilities, rates and clause weights keep four decimals
/// (finer than any NLI model or a weight scale of 1000 resolves); times keep a tenth of a millisecond.
/// </summary>
internal static class ReportNumbers
{
    public const int Decimals = 4;

    /// <summary>A probability, rate or clause weight, rounded; a non-finite value is refused, naming the field.</summary>
    public static double Round(double value, string field) => Clean(Math.Round(Finite(value, field), Decimals, MidpointRounding.AwayFromZero));

    public static double Milliseconds(TimeSpan span) => Clean(Math.Round(span.TotalMilliseconds, 1, MidpointRounding.AwayFromZero));

    /// <summary>ISO 8601 in UTC with milliseconds: one spelling of an instant, whatever offset the clock reported.</summary>
    public static string Instant(DateTimeOffset instant) =>
        instant.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.fff'Z'", CultureInfo.InvariantCulture);

    // -0 would print as "-0" and make two equal reports differ byte for byte.
    private static double Clean(double value) => value == 0.0 ? 0.0 : value;

    private static double Finite(double value, string field) =>
        double.IsFinite(value) ? value : throw new ArgumentException($"report field {field} is {value}; only finite numbers can be reported", field);
}
