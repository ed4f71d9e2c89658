namespace Plumbline.Reports.Comparison;

/// <summary>One run figure in both runs; null where a run cannot compute it (an accuracy without gold labels).</summary>
public sealed record FigureDelta(string Name, double? Old, double? New)
{
    /// <summary>New minus old; null when either is missing.</summary>
    public double? Change => Old is { } old && New is { } now ? now - old : null;
}
