namespace Plumbline.Core.Trees;

/// <summary>Outcome of the negation test on one statement.</summary>
public enum Integrity
{
    /// <summary>The model answers True for the statement and False for its negation.</summary>
    IntegralTrue,

    /// <summary>The model answers False for the statement and True for its negation.</summary>
    IntegralFalse,

    /// <summary>The answer does not flip under negation, so the model's view of it is not trustworthy.</summary>
    NotIntegral,
}
