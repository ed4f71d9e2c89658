using System.Collections.Concurrent;
using Plumbline.Core.Entailment;

namespace Plumbline.Benchmarks.Trees;

/// <summary>
/// The engine's NLI port over a <see cref="ScoreCache"/>. While planning, a pair not yet scored reads as
/// neutral and is noted in <see cref="Missing"/>; when measuring, a missing pair is an error, because a
/// figure must never rest on a placeholder score.
/// </summary>
internal sealed class CachedScorer(ScoreCache cache, string describe, bool planning) : IEntailmentScorer
{
    private static readonly EntailmentScores Placeholder = new(0.0, 1.0, 0.0);

    public ConcurrentDictionary<SentencePair, byte> Missing { get; } = new();

    public string Describe => describe;

    public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken)
    {
        var scores = new EntailmentScores[pairs.Count];
        for (var i = 0; i < pairs.Count; i++)
        {
            if (cache.TryGet(pairs[i], out var value))
            {
                scores[i] = value;
            }
            else if (planning)
            {
                Missing.TryAdd(pairs[i], 0);
                scores[i] = Placeholder;
            }
            else
            {
                throw new InvalidOperationException($"pair not in the score cache: \"{pairs[i].Premise}\" -> \"{pairs[i].Hypothesis}\"");
            }
        }

        return Task.FromResult<IReadOnlyList<EntailmentScores>>(scores);
    }
}
