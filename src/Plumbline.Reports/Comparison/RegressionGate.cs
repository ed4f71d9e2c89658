namespace Plumbline.Reports.Comparison;

/// <summary>
/// The comparison's gate: fail when the change is a regression a test can tell from chance. With gold labels, when
/// more claims went from right to wrong than the other way and McNemar's p-value is below <see cref="Alpha"/>;
/// without, when the answers shifted either way with p below <see cref="Alpha"/> (nothing says which run is better).
/// </summary>
/// <param name="Alpha">The significance level.</param>
/// <param name="PValue">The p-value of the test the gate used; null when no claim could be paired.</param>
/// <param name="Passed">Whether the gate holds.</param>
/// <param name="Reason">Why, in one line.</param>
public sealed record RegressionGate(double Alpha, double? PValue, bool Passed, string Reason)
{
    /// <summary>The gate's name, as the option and the config key spell it.</summary>
    public const string Name = "fail_on_regression";
}
