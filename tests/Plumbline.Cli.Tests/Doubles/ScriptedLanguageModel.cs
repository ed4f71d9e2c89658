using Plumbline.Core.Language;

namespace Plumbline.Cli.Tests.Doubles;

/// <summary>
/// A model that answers by rule, used only to make recording files for the tests: it writes explanations
/// "Reason k for/against S", negations "Not so: S", and believes explanations for True (0.8), doubts
/// explanations for False (0.3), and each claim as scripted. Every explanation passes the integrity test,
/// so trees stop at depth 1 and stay small. With <c>anyOtherClaim</c> every claim not scripted gets that belief.
/// </summary>
internal sealed class ScriptedLanguageModel(IReadOnlyDictionary<string, double> claimBeliefs, double? anyOtherClaim = null) : ILanguageModel
{
    private const string NegationMark = "Not so: ";

    public string Describe => "scripted";

    public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        IReadOnlyList<string> texts = request.Purpose == GenerationPurpose.Negation
            ? [NegationMark + request.Subject]
            : [.. Enumerable.Range(1, request.Count).Select(k => $"Reason {k} {(request.Answer == true ? "for" : "against")} {request.Subject}")];
        return Task.FromResult(new GenerationResult(texts, new TokenUsage(12, 6)));
    }

    public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        var p = PTrue(request.Statement)
            ?? throw new ModelRequestException($"no belief scripted for \"{request.Statement}\"");
        return Task.FromResult(AnswerProbabilities.FromRaw(p, 1 - p, usage: new TokenUsage(20, 1)));
    }

    private double? PTrue(string statement) =>
        statement.StartsWith(NegationMark, StringComparison.Ordinal) ? 1 - PTrue(statement[NegationMark.Length..])
        : statement.StartsWith("Reason ", StringComparison.Ordinal) ? (statement.Contains(" for ", StringComparison.Ordinal) ? 0.8 : 0.3)
        : claimBeliefs.TryGetValue(statement, out var p) ? p
        : anyOtherClaim;
}
