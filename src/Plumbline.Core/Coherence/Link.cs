using Plumbline.Core.Entailment;

namespace Plumbline.Core.Coherence;

/// <summary>An entailment or contradiction the NLI model found from statement <see cref="From"/> (premise) to <see cref="To"/> (hypothesis).</summary>
public sealed record Link(int From, int To, EntailmentKind Kind, double Probability);
