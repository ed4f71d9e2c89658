namespace Plumbline.Core.Coherence;

/// <summary>The engine settings that decide how a tree grows, besides its shape and the negation mode.</summary>
/// <param name="IntegrityGap">Least |p(True | E) - p(True | ~E)| for a statement to count as integral.</param>
/// <param name="DiscardCutOff">Drop explanations that do not end a sentence, and count them.</param>
/// <param name="ExpandIntegralClaim">Explain a claim that is integral at once.</param>
internal sealed record TreeRules(double IntegrityGap, bool DiscardCutOff, bool ExpandIntegralClaim)
{
    /// <summary>The flip test alone, every explanation kept, the claim always explained.</summary>
    public static TreeRules Plain { get; } = new(0.0, DiscardCutOff: false, ExpandIntegralClaim: true);

    public static TreeRules From(CoherenceOptions options) =>
        new(options.IntegrityGap, options.DiscardCutOff, options.ExpandIntegralClaim);
}
