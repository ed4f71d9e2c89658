namespace Plumbline.Core.Trees;

/// <summary>How a statement's belief becomes the weight of its unit clause.</summary>
public enum BeliefForm
{
    /// <summary>
    /// The believed side's share: p(T|E) / (p(T|E) + p(T|~E)) for a statement believed true, one minus that
    /// for one believed false; always above 0.5, so even a barely integral statement weighs half a link.
    /// </summary>
    Ratio,

    /// <summary>
    /// The normalised difference |p(T|E) - p(T|~E)| / (p(T|E) + p(T|~E)), in (0, 1]: a statement the model
    /// barely tells from its negation costs almost nothing to overrule.
    /// </summary>
    NormalisedDifference,
}
