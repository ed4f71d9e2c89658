using Plumbline.Core.Entailment;

namespace Plumbline.Core.Coherence;

/// <summary>A statement pair together with its NLI scores, so that scores never depend on list positions.</summary>
internal sealed record ScoredPair(StatementPair Pair, EntailmentScores Scores);
