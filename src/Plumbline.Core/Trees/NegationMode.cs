namespace Plumbline.Core.Trees;

/// <summary>How the negation of a statement is obtained for the integrity test.</summary>
public enum NegationMode
{
    /// <summary>Ask the model to rewrite the statement; use the fixed prefix when it returns nothing usable.</summary>
    Model,

    /// <summary>Always "It is not true that ...".</summary>
    Prefix,
}
