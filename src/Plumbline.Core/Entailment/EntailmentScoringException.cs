namespace Plumbline.Core.Entailment;

/// <summary>The NLI scorer could not score a batch (or returned the wrong number of results). The engine
/// turns it into a failed claim; anything else a scorer throws is treated as a bug.</summary>
public sealed class EntailmentScoringException(string message, Exception? inner = null) : Exception(message, inner);
