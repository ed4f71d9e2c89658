using Plumbline.Core.Entailment;

namespace Plumbline.Cli.Tests.Doubles;

/// <summary>Scores every pair neutral; enough to drive the engine while a recording is being made.</summary>
internal sealed class NeutralScorer : IEntailmentScorer
{
    public string Describe => "neutral";

    public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken) =>
        Task.FromResult<IReadOnlyList<EntailmentScores>>([.. pairs.Select(_ => new EntailmentScores(0.1, 0.8, 0.1))]);
}
