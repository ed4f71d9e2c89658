using System.Collections.Frozen;
using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>
/// Replays a recording: every request is looked up by its <see cref="RequestFingerprint"/> key.
/// The file is read and validated once; lookups afterwards touch only frozen dictionaries, so
/// concurrent calls need no locking.
/// </summary>
public sealed class RecordingLanguageModel : ILanguageModel
{
    private readonly string fileName;
    private readonly FrozenDictionary<string, RecordedEntry> entries;
    private readonly FrozenDictionary<string, int> linesByTopic;

    private RecordingLanguageModel(string path, string promptVersion, IReadOnlyList<RecordedEntry> entries)
    {
        fileName = System.IO.Path.GetFileName(path);
        PromptVersion = promptVersion;
        this.entries = entries.ToFrozenDictionary(e => e.Fingerprint.Key, StringComparer.Ordinal);
        this.linesByTopic = entries
            .GroupBy(e => e.Topic, StringComparer.Ordinal)
            .ToFrozenDictionary(g => g.Key, g => g.First().Line, StringComparer.Ordinal);
    }

    /// <summary>Reads and validates the whole recording.</summary>
    /// <param name="promptVersion">The engine's prompt version; a line recorded for another version is an error.</param>
    /// <exception cref="RecordingFormatException">A line is malformed; the message names file, line and field.</exception>
    public static async Task<RecordingLanguageModel> LoadAsync(string path, string promptVersion, CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        ArgumentException.ThrowIfNullOrEmpty(promptVersion);
        var entries = await RecordingReader.ReadAsync(path, promptVersion, cancellationToken).ConfigureAwait(false);
        return new RecordingLanguageModel(path, promptVersion, entries);
    }

    public string Describe => $"recording:{fileName}";

    public string PromptVersion { get; }

    /// <summary>Distinct requests in the recording.</summary>
    public int Count => entries.Count;

    public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        cancellationToken.ThrowIfCancellationRequested();
        var fingerprint = RequestFingerprint.Of(request, PromptVersion);
        if (entries.TryGetValue(fingerprint.Key, out var entry) && entry.Generation is { } recorded)
        {
            // The loader guarantees at least n texts; a hand-written line may hold more.
            return Task.FromResult(recorded.Texts.Count == request.Count
                ? recorded
                : recorded with { Texts = recorded.Texts.Take(request.Count).ToArray() });
        }

        var purpose = RequestFingerprint.NameOf(request.Purpose);
        var settings = request.Answer is { } answer ? $"answer {answer}, n={request.Count}" : $"n={request.Count}";
        if (request.SampleIndex > 0)
        {
            settings += $", sample {request.SampleIndex}";
        }

        var topic = RecordingReader.TopicOf(RequestFingerprint.GenerateKind, purpose, request.Subject, request.Answer);
        return Task.FromException<GenerationResult>(new ModelRequestException(
            $"no recorded response for {purpose} ({settings}) of \"{request.Subject}\" in {fileName}{Hint(topic)}"));
    }

    public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        cancellationToken.ThrowIfCancellationRequested();
        var fingerprint = RequestFingerprint.Of(request, PromptVersion);
        return entries.TryGetValue(fingerprint.Key, out var entry) && entry.Answer is { } recorded
            ? Task.FromResult(recorded)
            : Task.FromException<AnswerProbabilities>(new ModelRequestException(
                $"no recorded answer probabilities for \"{request.Statement}\" in {fileName}"));
    }

    private string Hint(string topic) =>
        linesByTopic.TryGetValue(topic, out var line)
            ? $" (line {line} has it with other decoding settings, n or sample)"
            : "";
}
