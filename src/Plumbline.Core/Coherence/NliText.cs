namespace Plumbline.Core.Coherence;

/// <summary>Which text stands for a statement when its pairs are scored by the NLI model.</summary>
public enum NliText
{
    /// <summary>Always the statement as written.</summary>
    Statement,

    /// <summary>
    /// For an explanation the model believes false (integral/False), its negation's text, which the model
    /// believes true; its links then constrain the statement's negated variable. The claim keeps its own text.
    /// </summary>
    NegationWhenFalse,
}
