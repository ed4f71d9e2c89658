using Plumbline.Core.Language;

namespace Plumbline.Models.Limits;

/// <summary>
/// Lets at most a fixed number of model calls run at once, whichever claims they belong to: one cap for
/// the whole run keeps many claims in flight without flooding the endpoint. Waiting for a slot honours
/// cancellation.
/// </summary>
public sealed class CappedLanguageModel : ILanguageModel
{
    private readonly ILanguageModel inner;
    private readonly SemaphoreSlim slots;

    public CappedLanguageModel(ILanguageModel inner, int maxConcurrentCalls)
    {
        ArgumentNullException.ThrowIfNull(inner);
        ArgumentOutOfRangeException.ThrowIfLessThan(maxConcurrentCalls, 1);
        this.inner = inner;
        MaxConcurrentCalls = maxConcurrentCalls;
        slots = new SemaphoreSlim(maxConcurrentCalls, maxConcurrentCalls);
    }

    public int MaxConcurrentCalls { get; }

    public string Describe => inner.Describe;

    public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken) =>
        InSlotAsync(() => inner.GenerateAsync(request, cancellationToken), cancellationToken);

    public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken) =>
        InSlotAsync(() => inner.ScoreAnswersAsync(request, cancellationToken), cancellationToken);

    public async ValueTask DisposeAsync()
    {
        await inner.DisposeAsync().ConfigureAwait(false);
        slots.Dispose();
    }

    private async Task<T> InSlotAsync<T>(Func<Task<T>> call, CancellationToken cancellationToken)
    {
        await slots.WaitAsync(cancellationToken).ConfigureAwait(false);
        try
        {
            return await call().ConfigureAwait(false);
        }
        finally
        {
            slots.Release();
        }
    }
}
