using Plumbline.Core.Language;

namespace Plumbline.Benchmarks.Engine;

/// <summary>
/// An instant language model whose answers grow the largest tree the default shape allows: the
/// claim and its depth-1 explanations never pass the integrity test (so each is expanded), depth-2
/// explanations always do (so nothing is pruned). Depth is read from the number of separators.
/// </summary>
internal sealed class FullTreeModel : ILanguageModel
{
    private const string Separator = " | ";
    private const string NegationMark = "It is false that ";

    public string Describe => "instant full-tree model";

    public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        IReadOnlyList<string> texts = request.Purpose == GenerationPurpose.Negation
            ? [NegationMark + request.Subject]
            : [.. Enumerable.Range(0, request.Count).Select(k => $"{request.Subject}{Separator}{(request.Answer == true ? "for" : "against")} {k}")];
        return Task.FromResult(new GenerationResult(texts, new TokenUsage(200, 20)));
    }

    public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        var negated = request.Statement.StartsWith(NegationMark, StringComparison.Ordinal);
        var depth = Count(request.Statement, Separator);
        var spread = Stable.Fraction(request.Statement);
        double pTrue;
        if (depth < 2)
        {
            pTrue = 0.55 + 0.4 * spread; // True for a statement and for its negation: not integral
        }
        else
        {
            // Integral: half the leaves read True, half False, with varied confidence.
            var leafTrue = Stable.Fraction(negated ? request.Statement[NegationMark.Length..] : request.Statement) < 0.5;
            var confidence = 0.6 + 0.35 * spread;
            pTrue = leafTrue != negated ? confidence : 1 - confidence;
        }

        return Task.FromResult(AnswerProbabilities.FromRaw(pTrue, 1 - pTrue, usage: new TokenUsage(150, 1)));
    }

    private static int Count(string text, string part)
    {
        var count = 0;
        for (var at = text.IndexOf(part, StringComparison.Ordinal); at >= 0; at = text.IndexOf(part, at + part.Length, StringComparison.Ordinal))
        {
            count++;
        }

        return count;
    }
}
