namespace Plumbline.Core.Language;

/// <summary>
/// Port to a language model. Implementations must be safe for concurrent calls: the engine issues
/// independent requests of one tree level at the same time. A model may hold connections, files or
/// native memory, so the port is disposable; one that holds nothing keeps the empty default.
/// </summary>
public interface ILanguageModel : IAsyncDisposable
{
    /// <summary>A short, stable description for reports ("recording:samples/x.jsonl", "http:gpt-x").</summary>
    string Describe { get; }

    Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken);

    Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken);

    ValueTask IAsyncDisposable.DisposeAsync()
    {
        GC.SuppressFinalize(this);
        return ValueTask.CompletedTask;
    }
}
