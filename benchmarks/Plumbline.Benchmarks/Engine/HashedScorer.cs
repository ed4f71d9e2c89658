using Plumbline.Core.Entailment;

namespace Plumbline.Benchmarks.Engine;

/// <summary>
/// An instant NLI scorer with a fixed, text-derived mix of labels (about 15% entailment, 10%
/// contradiction), so the solver sees a realistic number of consistency clauses.
/// </summary>
internal sealed class HashedScorer : IEntailmentScorer
{
    public string Describe => "instant hashed NLI";

    public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken)
    {
        var scores = new EntailmentScores[pairs.Count];
        for (var i = 0; i < pairs.Count; i++)
        {
            var draw = Stable.Fraction(pairs[i].Premise + "\n" + pairs[i].Hypothesis);
            var strength = 0.5 + 0.45 * Stable.Fraction(pairs[i].Hypothesis + "\n" + pairs[i].Premise);
            var rest = (1 - strength) / 2;
            scores[i] = draw switch
            {
                < 0.15 => new EntailmentScores(strength, rest, rest),
                < 0.25 => new EntailmentScores(rest, rest, strength),
                _ => new EntailmentScores(rest, strength, rest),
            };
        }

        return Task.FromResult<IReadOnlyList<EntailmentScores>>(scores);
    }
}
