using Plumbline.Core.Entailment;

namespace Plumbline.Nli;

/// <summary>A scored pair as cached: the probabilities, the truncation flag and the raw logits in model order.</summary>
internal sealed record ScoredPair(EntailmentScores Scores, bool Truncated, float[] Logits);
