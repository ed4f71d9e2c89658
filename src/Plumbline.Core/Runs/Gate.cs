using System.Collections.Frozen;

namespace Plumbline.Core.Runs;

/// <summary>
/// A threshold on one run figure. Accuracies and the mean margin must reach their threshold (at least), rates and
/// failed claims must stay at or under it. A figure that cannot be computed (an accuracy without gold labels, a rate
/// or mean with no claim judged) fails its gate: a gate that passed because its figure went missing would hide the
/// very change it is there to catch.
/// </summary>
/// <param name="Figure">The figure checked.</param>
/// <param name="Threshold">The least (or most) value allowed.</param>
public sealed record Gate(GateFigure Figure, double Threshold)
{
    /// <summary>
    /// How close to the threshold a figure may fall and still meet it: figures are sums and quotients of doubles,
    /// so a mean margin meant to equal 0.3 can come out one rounding step short.
    /// </summary>
    public const double Tolerance = 1e-9;

    private static readonly (GateFigure Figure, string Name, bool AtLeast)[] Kinds =
    [
        (GateFigure.CoherentAccuracy, "min_coherent_accuracy", true),
        (GateFigure.CoherentLowerBound, "min_coherent_lower_bound", true),
        (GateFigure.DirectAccuracy, "min_direct_accuracy", true),
        (GateFigure.OverturnRate, "max_overturn_rate", false),
        (GateFigure.ContestedRate, "max_contested_rate", false),
        (GateFigure.FailedClaims, "max_failed", false),
        (GateFigure.MeanMargin, "min_mean_margin", true),
    ];

    private static readonly FrozenDictionary<string, GateFigure> ByName =
        Kinds.ToFrozenDictionary(k => k.Name, k => k.Figure, StringComparer.Ordinal);

    /// <summary>Every gate's name, in a fixed order (the order reports list them in).</summary>
    public static IReadOnlyList<string> Names { get; } = [.. Kinds.Select(k => k.Name)];

    /// <summary>The gate's name: min_ or max_ and the figure, as the config key and the report spell it.</summary>
    public string Name => KindOf(Figure).Name;

    /// <summary>True when the figure must reach the threshold; false when it must stay at or under it.</summary>
    public bool AtLeast => KindOf(Figure).AtLeast;

    /// <summary>"&gt;=" or "&lt;=".</summary>
    public string Comparison => AtLeast ? ">=" : "<=";

    /// <summary>The name of the gate on <paramref name="figure"/>.</summary>
    public static string NameOf(GateFigure figure) => KindOf(figure).Name;

    /// <summary>The gate named <paramref name="name"/> with <paramref name="threshold"/>, or null when no gate has that name.</summary>
    public static Gate? Named(string name, double threshold) =>
        ByName.TryGetValue(name, out var figure) ? new Gate(figure, threshold) : null;

    /// <summary>The figure's value in <paramref name="figures"/>, or null when it cannot be computed.</summary>
    public double? ValueIn(RunFigures figures)
    {
        ArgumentNullException.ThrowIfNull(figures);
        var judged = figures.Judged > 0;
        return Figure switch
        {
            GateFigure.CoherentAccuracy => figures.CoherentAccuracy?.Value,
            GateFigure.CoherentLowerBound => figures.CoherentAccuracy?.Low,
            GateFigure.DirectAccuracy => figures.DirectAccuracy?.Value,
            GateFigure.OverturnRate => judged ? figures.OverturnRate : null,
            GateFigure.ContestedRate => judged ? figures.ContestedRate : null,
            GateFigure.FailedClaims => figures.Failed,
            GateFigure.MeanMargin => judged ? figures.MeanMargin : null,
            _ => throw new ArgumentOutOfRangeException(nameof(figures), Figure, "unknown gate figure"),
        };
    }

    /// <summary>Checks the gate on <paramref name="figures"/>.</summary>
    public GateResult Check(RunFigures figures)
    {
        var value = ValueIn(figures);
        var passed = value is { } v && (AtLeast ? v >= Threshold - Tolerance : v <= Threshold + Tolerance);
        return new GateResult(Name, value, Comparison, Threshold, passed);
    }

    /// <summary>Checks every gate, in the order given.</summary>
    public static IReadOnlyList<GateResult> CheckAll(IEnumerable<Gate> gates, RunFigures figures) =>
        [.. gates.Select(g => g.Check(figures))];

    private static (GateFigure Figure, string Name, bool AtLeast) KindOf(GateFigure figure) =>
        Array.Find(Kinds, k => k.Figure == figure) is { Name: not null } kind
            ? kind
            : throw new ArgumentOutOfRangeException(nameof(figure), figure, "unknown gate figure");
}
