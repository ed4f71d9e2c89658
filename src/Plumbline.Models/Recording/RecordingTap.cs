using System.Collections.Concurrent;
using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>
/// Passes requests to a live model and writes each answer to a recording. A request asked twice
/// gets the first response again and is written once, so replaying the recording gives exactly
/// what the live run saw.
/// </summary>
public sealed class RecordingTap(ILanguageModel inner, RecordingWriter writer) : ILanguageModel
{
    private readonly ConcurrentDictionary<string, GenerationResult> generations = new(StringComparer.Ordinal);
    private readonly ConcurrentDictionary<string, AnswerProbabilities> answers = new(StringComparer.Ordinal);

    /// <summary>The live model's description: a tap does not change what is being asked.</summary>
    public string Describe => inner.Describe;

    public async Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        var result = await inner.GenerateAsync(request, cancellationToken).ConfigureAwait(false);
        if (result.Texts.Count < request.Count)
        {
            throw new ModelRequestException(
                $"{inner.Describe} returned {result.Texts.Count} texts where {request.Count} were asked for " +
                $"({RequestFingerprint.NameOf(request.Purpose)} of \"{request.Subject}\")");
        }

        // Extra texts are dropped here rather than at replay, so live and replayed runs agree.
        if (result.Texts.Count > request.Count)
        {
            result = result with { Texts = result.Texts.Take(request.Count).ToArray() };
        }

        var key = RequestFingerprint.Of(request, writer.PromptVersion).Key;
        var kept = generations.GetOrAdd(key, result);
        if (ReferenceEquals(kept, result))
        {
            // Not cancellable: the response is already in hand and the run will rely on it.
            await writer.WriteAsync(request, result, CancellationToken.None).ConfigureAwait(false);
        }

        return kept;
    }

    public async Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        var result = await inner.ScoreAnswersAsync(request, cancellationToken).ConfigureAwait(false);
        var key = RequestFingerprint.Of(request, writer.PromptVersion).Key;
        var kept = answers.GetOrAdd(key, result);
        if (ReferenceEquals(kept, result))
        {
            await writer.WriteAsync(request, result, CancellationToken.None).ConfigureAwait(false);
        }

        return kept;
    }
}
