namespace Plumbline.Core.Runs;

/// <summary>One gate checked on the run figures: which figure, its value, the threshold and the outcome.</summary>
/// <param name="Name">The gate's name, as the option or config key spells it.</param>
/// <param name="Value">The figure's value; null when it cannot be computed (no gold labels, nothing judged).</param>
/// <param name="Comparison">How value and threshold are compared, as text ("&gt;=", "&lt;=").</param>
/// <param name="Threshold">The threshold.</param>
/// <param name="Passed">Whether the gate holds.</param>
public sealed record GateResult(string Name, double? Value, string Comparison, double Threshold, bool Passed);
