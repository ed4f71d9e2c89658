namespace Plumbline.Core.Coherence;

/// <summary>Which direct answer a verdict's status compares the coherent answer with (both are always reported).</summary>
public enum DirectAnswerRule
{
    /// <summary>True when p(True | claim) is above 0.5.</summary>
    Plain,

    /// <summary>
    /// True when p(True | claim) is above p(True | negated claim), false when below; a tie falls back to the
    /// plain direct answer. Uses the model's view of both wordings, as the integrity test does.
    /// </summary>
    Paired,
}
