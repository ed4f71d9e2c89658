namespace Plumbline.Core.Entailment;

/// <summary>Port to an NLI cross-encoder: a batch of pairs in, three probabilities per pair out, in order.</summary>
public interface IEntailmentScorer
{
    /// <summary>Identifies the model for reports (name and file hash).</summary>
    string Describe { get; }

    Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken);
}
