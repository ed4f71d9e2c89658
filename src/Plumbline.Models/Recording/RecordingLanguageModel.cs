using Microsoft.Win32.SafeHandles;
using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>
/// Replays a recording: every request is looked up by its <see cref="RequestFingerprint"/> key.
/// The file is read and validated once; afterwards only a <see cref="RecordingIndex"/> stays in memory, and a
/// lookup reads its one line back from the file and parses it again, so memory does not grow with the recording.
/// The index is frozen and reads go by offset, so concurrent calls need no locking.
/// </summary>
public sealed class RecordingLanguageModel : ILanguageModel
{
    private readonly string path;
    private readonly string fileName;
    private readonly SafeFileHandle file;
    private readonly RecordingIndex index;

    private RecordingLanguageModel(string path, string promptVersion, SafeFileHandle file, RecordingIndex index)
    {
        this.path = path;
        fileName = System.IO.Path.GetFileName(path);
        PromptVersion = promptVersion;
        this.file = file;
        this.index = index;
    }

    /// <summary>Reads and validates the whole recording and keeps it open for lookups until disposed.</summary>
    /// <param name="promptVersion">The engine's prompt version; a line recorded for another version is an error.</param>
    /// <exception cref="RecordingFormatException">A line is malformed; the message names file, line and field.</exception>
    public static async Task<RecordingLanguageModel> LoadAsync(string path, string promptVersion, CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        ArgumentException.ThrowIfNullOrEmpty(promptVersion);

        // One handle for validating and for every lookup, so that the lines looked up are the lines validated even if
        // the file is replaced (renamed over) meanwhile.
        var file = await RecordingFileLines.OpenAsync(path, cancellationToken).ConfigureAwait(false);
        try
        {
            var index = await RecordingIndex.BuildAsync(file, path, promptVersion, cancellationToken).ConfigureAwait(false);
            return new RecordingLanguageModel(path, promptVersion, file, index);
        }
        catch
        {
            file.Dispose();
            throw;
        }
    }

    public string Describe => $"recording:{fileName}";

    public string PromptVersion { get; }

    /// <summary>Distinct requests in the recording.</summary>
    public int Count => index.Count;

    public async Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        cancellationToken.ThrowIfCancellationRequested();
        var fingerprint = RequestFingerprint.Of(request, PromptVersion);
        if (await FindAsync(fingerprint, cancellationToken).ConfigureAwait(false) is { Generation: { } recorded })
        {
            // The loader guarantees at least n texts; a hand-written line may hold more.
            return recorded.Texts.Count == request.Count
                ? recorded
                : recorded with { Texts = recorded.Texts.Take(request.Count).ToArray() };
        }

        var purpose = RequestFingerprint.NameOf(request.Purpose);
        var settings = request.Answer is { } answer ? $"answer {answer}, n={request.Count}" : $"n={request.Count}";
        if (request.SampleIndex > 0)
        {
            settings += $", sample {request.SampleIndex}";
        }

        var topic = RecordingReader.TopicOf(RequestFingerprint.GenerateKind, purpose, request.Subject, request.Answer);
        throw new ModelRequestException(
            $"no recorded response for {purpose} ({settings}) of \"{request.Subject}\" in {fileName}{Hint(topic)}");
    }

    public async Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        cancellationToken.ThrowIfCancellationRequested();
        var fingerprint = RequestFingerprint.Of(request, PromptVersion);
        return await FindAsync(fingerprint, cancellationToken).ConfigureAwait(false) is { Answer: { } recorded }
            ? recorded
            : throw new ModelRequestException($"no recorded answer probabilities for \"{request.Statement}\" in {fileName}");
    }

    public ValueTask DisposeAsync()
    {
        file.Dispose();
        return ValueTask.CompletedTask;
    }

    /// <summary>The recorded line for <paramref name="fingerprint"/>, read back and parsed; null when none was recorded.</summary>
    private async Task<RecordedEntry?> FindAsync(RequestFingerprint fingerprint, CancellationToken cancellationToken)
    {
        if (!index.TryFind(fingerprint.Key, out var position))
        {
            return null;
        }

        RecordedEntry entry;
        try
        {
            var text = await RecordingFileLines.ReadAsync(file, position, cancellationToken).ConfigureAwait(false);
            entry = RecordingReader.ParseLine(path, position.Number, PromptVersion, text);
        }
        catch (Exception e) when (e is RecordingFormatException or EndOfStreamException)
        {
            throw Changed(position);
        }

        // The full key guards against a file written over in place since it was validated.
        return entry.Fingerprint.Key == fingerprint.Key ? entry : throw Changed(position);
    }

    private ModelRequestException Changed(LinePosition position) =>
        new($"{fileName} changed since it was loaded: line {position.Number} no longer holds the request it held; load the recording again");

    private string Hint(string topic) =>
        index.TryFindTopic(topic, out var line)
            ? $" (line {line} has it with other decoding settings, n or sample)"
            : "";
}
