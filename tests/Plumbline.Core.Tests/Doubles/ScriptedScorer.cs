using Plumbline.Core.Entailment;

namespace Plumbline.Core.Tests.Doubles;

/// <summary>NLI scores from a script keyed by (premise, hypothesis); unscripted pairs are neutral. Records each batch.</summary>
internal sealed class ScriptedScorer : IEntailmentScorer
{
    public static readonly EntailmentScores Neutral = new(0.1, 0.8, 0.1);

    public Dictionary<(string Premise, string Hypothesis), EntailmentScores> Scores { get; } = [];

    public List<IReadOnlyList<SentencePair>> Batches { get; } = [];

    public string Describe => "scripted-nli";

    public static EntailmentScores Entails(double p) => new(p, (1 - p) / 2, (1 - p) / 2);

    public static EntailmentScores Contradicts(double p) => new((1 - p) / 2, (1 - p) / 2, p);

    public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken)
    {
        Batches.Add(pairs);
        IReadOnlyList<EntailmentScores> result =
            [.. pairs.Select(p => Scores.TryGetValue((p.Premise, p.Hypothesis), out var s) ? s : Neutral)];
        return Task.FromResult(result);
    }
}
