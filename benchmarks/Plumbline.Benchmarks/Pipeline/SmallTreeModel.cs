using Plumbline.Core.Coherence;
using Plumbline.Core.Language;

namespace Plumbline.Benchmarks.Pipeline;

/// <summary>
/// An instant model for the memory benchmark: one explanation per answer, each integral at once (believed 0.8 when
/// written for True, 0.3 when written for False), so every tree holds three statements and six ordered pairs.
/// Negations use the fixed prefix, whose statements it answers as the opposite of the statement.
/// </summary>
internal sealed class SmallTreeModel : ILanguageModel
{
    public string Describe => "instant small-tree model";

    public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken) =>
        Task.FromResult(new GenerationResult(
            [.. Enumerable.Range(0, request.Count).Select(k => $"Reason {k} {(request.Answer == true ? "for" : "against")}: {request.Subject}")],
            new TokenUsage(60, 12)));

    public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        var negated = request.Statement.StartsWith(PromptBook.NegationPrefix, StringComparison.Ordinal);
        var statement = negated ? request.Statement[PromptBook.NegationPrefix.Length..] : request.Statement;
        var pTrue = statement.StartsWith("reason", StringComparison.OrdinalIgnoreCase)
            ? (statement.Contains(" for:", StringComparison.Ordinal) ? 0.8 : 0.3)
            : 0.7;
        var p = negated ? 1 - pTrue : pTrue;
        return Task.FromResult(AnswerProbabilities.FromRaw(p, 1 - p, usage: new TokenUsage(40, 1)));
    }
}
