namespace Plumbline.Models.Http;

/// <summary>
/// One request that did not give a usable answer. <see cref="Transient"/> failures (429, 5xx, a
/// malformed or incomplete body) are retried; the others (400, 401, 403, 404 ...) are not. The message
/// never holds a credential.
/// </summary>
internal sealed class EndpointFailure(string message, bool transient, int? status = null, TimeSpan? retryAfter = null)
    : Exception(message)
{
    public bool Transient { get; } = transient;

    public int? Status { get; } = status;

    /// <summary>How long the endpoint asked us to wait (Retry-After), when it said.</summary>
    public TimeSpan? RetryAfter { get; } = retryAfter;
}
