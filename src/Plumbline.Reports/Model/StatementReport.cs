using Plumbline.Core.Coherence;
using Plumbline.Core.Trees;

namespace Plumbline.Reports.Model;

/// <summary>One statement of a claim's tree as a report shows it.</summary>
/// <param name="Id">Its id (0 is the claim).</param>
/// <param name="Text">The statement.</param>
/// <param name="Negation">The statement saying the opposite.</param>
/// <param name="NegationFromModel">False when the fixed prefix was used.</param>
/// <param name="Depth">0 for the claim.</param>
/// <param name="Parent">The statement it explains; null for the claim.</param>
/// <param name="GeneratedFor">The answer it was written to support; null for the claim.</param>
/// <param name="Integrity">Whether the model's answer flips under negation.</param>
/// <param name="Belief">The model's belief in it.</param>
/// <param name="PTrue">p(True | statement).</param>
/// <param name="PTrueOfNegation">p(True | negation).</param>
/// <param name="Kept">False when pruned.</param>
/// <param name="Value">Its truth value in the chosen optimum; null when pruned or when no solve happened.</param>
/// <param name="Links">The links that touch it, in either direction.</param>
public sealed record StatementReport(
    int Id,
    string Text,
    string Negation,
    bool NegationFromModel,
    int Depth,
    int? Parent,
    bool? GeneratedFor,
    Integrity Integrity,
    double Belief,
    double PTrue,
    double PTrueOfNegation,
    bool Kept,
    bool? Value,
    IReadOnlyList<Link> Links);
