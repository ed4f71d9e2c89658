using Plumbline.Core.Language;
using Plumbline.Models.Recording;

namespace Plumbline.Models.Cache;

/// <summary>
/// Serves responses from the <see cref="ResponseCache"/> and keeps every new one there, filed under the
/// model's identity. Outermost of the model decorators: a cached answer costs no budget and takes no
/// slot. A cached response carries the tokens it cost when it was made, so a rerun reports the same
/// figures as the run that paid for them.
/// </summary>
public sealed class CachedLanguageModel(
    ILanguageModel inner,
    ResponseCache cache,
    ModelIdentity identity,
    string promptVersion,
    CacheMode mode = CacheMode.Use) : ILanguageModel
{
    private int hits;
    private int stored;
    private int storeFailures;
    private string? firstStoreFailure;

    public string Describe => inner.Describe;

    /// <summary>Requests answered from the cache.</summary>
    public int Hits => Volatile.Read(ref hits);

    /// <summary>New responses committed to the cache.</summary>
    public int Stored => Volatile.Read(ref stored);

    /// <summary>Why storing failed the first time (the run goes on without keeping those responses); null when it never did.</summary>
    public string? StoreFailure => Volatile.Read(ref storeFailures) == 0 ? null : firstStoreFailure;

    public async Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        var fingerprint = RequestFingerprint.Of(request, promptVersion);
        var key = ResponseCacheKey.Of(identity, fingerprint, request.Prompt);
        if (await FindAsync(key, fingerprint, cancellationToken).ConfigureAwait(false) is { Generation: { } cached }
            && cached.Texts.Count >= request.Count)
        {
            Interlocked.Increment(ref hits);
            return cached.Texts.Count == request.Count ? cached : cached with { Texts = cached.Texts.Take(request.Count).ToArray() };
        }

        var result = await inner.GenerateAsync(request, cancellationToken).ConfigureAwait(false);
        if (result.Texts.Count > request.Count)
        {
            result = result with { Texts = result.Texts.Take(request.Count).ToArray() };
        }

        await KeepAsync(key, fingerprint, RecordingLine.Response(result)).ConfigureAwait(false);
        return result;
    }

    public async Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        var fingerprint = RequestFingerprint.Of(request, promptVersion);
        var key = ResponseCacheKey.Of(identity, fingerprint, request.Prompt);
        if (await FindAsync(key, fingerprint, cancellationToken).ConfigureAwait(false) is { Answer: { } cached })
        {
            Interlocked.Increment(ref hits);
            return cached;
        }

        var result = await inner.ScoreAnswersAsync(request, cancellationToken).ConfigureAwait(false);
        await KeepAsync(key, fingerprint, RecordingLine.Response(result)).ConfigureAwait(false);
        return result;
    }

    public ValueTask DisposeAsync() => inner.DisposeAsync();

    private async Task<RecordedEntry?> FindAsync(string key, RequestFingerprint fingerprint, CancellationToken cancellationToken)
    {
        if (mode == CacheMode.Refresh)
        {
            return null;
        }

        string? response;
        try
        {
            response = await cache.FindAsync(key, cancellationToken).ConfigureAwait(false);
        }
        catch (Microsoft.Data.Sqlite.SqliteException)
        {
            // A cache that cannot be read is no reason to fail a claim: the model is asked instead.
            return null;
        }

        if (response is null)
        {
            return null;
        }

        try
        {
            return RecordingReader.ParseLine(cache.FilePath, 0, promptVersion, RecordingLine.Format(fingerprint, response));
        }
        catch (RecordingFormatException)
        {
            // A row this build cannot read is treated as missing and replaced by a fresh answer.
            return null;
        }
    }

    private async Task KeepAsync(string key, RequestFingerprint fingerprint, string response)
    {
        try
        {
            // Not cancellable: the response is paid for, and a rerun after an interrupt should find it.
            await cache.StoreAsync(identity, key, fingerprint, response, replace: mode == CacheMode.Refresh).ConfigureAwait(false);
            Interlocked.Increment(ref stored);
        }
        catch (Exception e) when (e is Microsoft.Data.Sqlite.SqliteException or IOException or ObjectDisposedException)
        {
            if (Interlocked.Increment(ref storeFailures) == 1)
            {
                firstStoreFailure = e.Message;
            }
        }
    }
}
