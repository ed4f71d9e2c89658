using System.Text;
using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>
/// Appends request/response lines to a recording. Safe for concurrent callers; each line is
/// flushed as soon as it is written, so an interrupted run keeps everything recorded so far.
/// </summary>
public sealed class RecordingWriter : IAsyncDisposable, IDisposable
{
    private readonly FileStream stream;
    private readonly SemaphoreSlim gate = new(1, 1);

    private RecordingWriter(string path, string promptVersion, FileStream stream)
    {
        Path = path;
        PromptVersion = promptVersion;
        this.stream = stream;
    }

    /// <summary>Starts a new recording file.</summary>
    /// <param name="overwrite">Replace an existing file; otherwise an existing file is an <see cref="IOException"/>,
    /// because adding a live run's lines to an older recording could give one request two responses.</param>
    public static RecordingWriter Create(string path, string promptVersion, bool overwrite = false)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        ArgumentException.ThrowIfNullOrEmpty(promptVersion);
        var stream = new FileStream(path, overwrite ? FileMode.Create : FileMode.CreateNew, FileAccess.Write, FileShare.Read);
        return new RecordingWriter(path, promptVersion, stream);
    }

    public string Path { get; }

    public string PromptVersion { get; }

    /// <exception cref="ArgumentException">The result holds fewer texts than the request asked for;
    /// such a line could not be replayed.</exception>
    public Task WriteAsync(GenerationRequest request, GenerationResult result, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(result);
        if (result.Texts.Count < request.Count)
        {
            throw new ArgumentException($"{result.Texts.Count} texts for a request of n={request.Count}", nameof(result));
        }

        var fingerprint = RequestFingerprint.Of(request, PromptVersion);
        return AppendAsync(RecordingLine.Format(fingerprint, RecordingLine.Response(result)), cancellationToken);
    }

    public Task WriteAsync(AnswerRequest request, AnswerProbabilities result, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(result);
        var fingerprint = RequestFingerprint.Of(request, PromptVersion);
        return AppendAsync(RecordingLine.Format(fingerprint, RecordingLine.Response(result)), cancellationToken);
    }

    public async ValueTask DisposeAsync()
    {
        await stream.DisposeAsync().ConfigureAwait(false);
        gate.Dispose();
    }

    public void Dispose()
    {
        stream.Dispose();
        gate.Dispose();
    }

    private async Task AppendAsync(string line, CancellationToken cancellationToken)
    {
        var bytes = Encoding.UTF8.GetBytes(line + "\n");
        await gate.WaitAsync(cancellationToken).ConfigureAwait(false);
        try
        {
            await stream.WriteAsync(bytes, cancellationToken).ConfigureAwait(false);
            await stream.FlushAsync(cancellationToken).ConfigureAwait(false);
        }
        finally
        {
            gate.Release();
        }
    }
}
