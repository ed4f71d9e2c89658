using Plumbline.Core.Entailment;

namespace Plumbline.Nli;

/// <summary>Scores of one pair and whether the pair had to be cut to the model's maximum length.</summary>
public readonly record struct NliPairResult(EntailmentScores Scores, bool Truncated);
