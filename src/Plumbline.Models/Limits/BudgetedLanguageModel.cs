using Plumbline.Core.Language;
using Plumbline.Core.Runs;

namespace Plumbline.Models.Limits;

/// <summary>Counts every call that reaches the model against a <see cref="CallBudget"/>; a call the budget
/// refuses halts the run (<see cref="RunHaltedException"/>) instead of being sent. Placed inside the
/// response cache, so answers served from the cache cost nothing.</summary>
public sealed class BudgetedLanguageModel(ILanguageModel inner, CallBudget budget) : ILanguageModel
{
    public string Describe => inner.Describe;

    public async Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        Start();
        var result = await inner.GenerateAsync(request, cancellationToken).ConfigureAwait(false);
        budget.Spend(result.Usage);
        return result;
    }

    public async Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        Start();
        var result = await inner.ScoreAnswersAsync(request, cancellationToken).ConfigureAwait(false);
        budget.Spend(result.Usage);
        return result;
    }

    public ValueTask DisposeAsync() => inner.DisposeAsync();

    private void Start()
    {
        if (!budget.TryStartCall())
        {
            throw new RunHaltedException(budget.Reason!);
        }
    }
}
