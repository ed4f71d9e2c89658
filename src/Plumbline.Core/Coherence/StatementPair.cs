using Plumbline.Core.Entailment;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>
/// An ordered pair of kept statements as the NLI model sees it: premise first. A side marked negated is
/// scored by its negation's text, and a link from or to it constrains the statement's negated variable.
/// </summary>
internal sealed record StatementPair(Statement Premise, Statement Hypothesis, bool PremiseNegated, bool HypothesisNegated)
{
    public string PremiseText => PremiseNegated ? Premise.Negation : Premise.Text;

    public string HypothesisText => HypothesisNegated ? Hypothesis.Negation : Hypothesis.Text;

    public SentencePair Sentences => new(PremiseText, HypothesisText);
}
