using Plumbline.Core.Entailment;

namespace Plumbline.Core.Coherence;

/// <summary>
/// An entailment or contradiction the NLI model found from statement <see cref="From"/> (premise) to
/// <see cref="To"/> (hypothesis). <see cref="FromNegation"/> / <see cref="ToNegation"/> say that the
/// statement's negation's text was scored in its place (see <see cref="NliText.NegationWhenFalse"/>).
/// </summary>
public sealed record Link(int From, int To, EntailmentKind Kind, double Probability, bool FromNegation = false, bool ToNegation = false);
