using System.Text.Json.Serialization;

namespace Plumbline.Core.Trees;

/// <summary>One node of an explanation tree: the claim itself (id 0) or an explanation the model wrote.</summary>
/// <param name="Id">Position in the tree's statement list; 0 is the root (the claim).</param>
/// <param name="Text">The statement as written.</param>
/// <param name="Negation">The statement saying the opposite, used for the integrity test.</param>
/// <param name="NegationFromModel">False when the fixed prefix was used instead of a model-written negation.</param>
/// <param name="Depth">0 for the root, 1 for explanations of the claim, and so on.</param>
/// <param name="ParentId">The statement this one explains (the first one, when several produced it); null for the root.</param>
/// <param name="GeneratedFor">The answer this statement was written to support; null for the root.</param>
/// <param name="PTrue">p(True | statement).</param>
/// <param name="PTrueOfNegation">p(True | negation).</param>
/// <param name="Integrity">Whether the model's answer flips under negation.</param>
/// <param name="Belief">p(True|E) / (p(True|E) + p(True|~E)); 0.5 when both are 0.</param>
/// <param name="Kept">False when pruning removed the statement.</param>
public sealed record Statement(
    int Id,
    string Text,
    string Negation,
    bool NegationFromModel,
    int Depth,
    int? ParentId,
    bool? GeneratedFor,
    double PTrue,
    double PTrueOfNegation,
    Integrity Integrity,
    double Belief,
    bool Kept)
{
    [JsonIgnore]
    public bool IsRoot => Id == 0;

    [JsonIgnore]
    public bool IsIntegral => Integrity != Integrity.NotIntegral;

    /// <summary>The belief of a statement given the two probabilities of "True".</summary>
    public static double BeliefOf(double pTrue, double pTrueOfNegation)
    {
        var sum = pTrue + pTrueOfNegation;
        return sum <= 0 ? 0.5 : pTrue / sum;
    }

    /// <summary>
    /// The integrity test with a minimum gap: the argmax answer flips under negation and p(True | E) and
    /// p(True | ~E) differ by more than <paramref name="minimumGap"/>. With a gap of 0 this is the plain
    /// flip test, since a flip already puts the two on opposite sides of 0.5.
    /// </summary>
    public static Integrity IntegrityOf(bool answerForStatement, bool answerForNegation, double pTrue, double pTrueOfNegation, double minimumGap)
    {
        var flip = IntegrityOf(answerForStatement, answerForNegation);
        return flip != Integrity.NotIntegral && Math.Abs(pTrue - pTrueOfNegation) > minimumGap ? flip : Integrity.NotIntegral;
    }

    /// <summary>
    /// The weight of a unit clause for the side the model believes (<paramref name="believedTrue"/>), from
    /// belief b = p(True | E) / (p(True | E) + p(True | ~E)): that side's share, b or 1 - b
    /// (<see cref="BeliefForm.Ratio"/>), or the normalised difference |2b - 1|, which equals
    /// |p(True | E) - p(True | ~E)| / (p(True | E) + p(True | ~E)).
    /// </summary>
    public static double BeliefWeight(double belief, bool believedTrue, BeliefForm form) =>
        form == BeliefForm.NormalisedDifference ? Math.Abs(2 * belief - 1)
        : believedTrue ? belief : 1 - belief;

    /// <summary>The weight of this integral statement's belief clause.</summary>
    public double BeliefWeight(BeliefForm form) => BeliefWeight(Belief, Integrity == Integrity.IntegralTrue, form);

    /// <summary>The integrity test: integral when the argmax answer flips under negation.</summary>
    public static Integrity IntegrityOf(bool answerForStatement, bool answerForNegation) =>
        (answerForStatement, answerForNegation) switch
        {
            (true, false) => Integrity.IntegralTrue,
            (false, true) => Integrity.IntegralFalse,
            _ => Integrity.NotIntegral,
        };
}
