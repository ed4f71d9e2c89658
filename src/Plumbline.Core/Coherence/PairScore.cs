using Plumbline.Core.Entailment;

namespace Plumbline.Core.Coherence;

/// <summary>
/// The NLI scores of one ordered statement pair: <see cref="From"/> as premise, <see cref="To"/> as hypothesis.
/// <see cref="FromNegation"/> / <see cref="ToNegation"/> say that the statement's negation's text was scored
/// in its place (see <see cref="NliText.NegationWhenFalse"/>).
/// </summary>
/// <remarks>The pair and its scores travel together, so no reader depends on two lists sharing an order.</remarks>
public sealed record PairScore(int From, int To, EntailmentScores Scores, bool FromNegation = false, bool ToNegation = false);
