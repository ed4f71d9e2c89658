namespace Plumbline.Models.Http;

/// <summary>How model calls survive a flaky endpoint.</summary>
/// <param name="MaxRetries">Retries after the first attempt (so at most MaxRetries + 1 requests per call).</param>
/// <param name="BaseDelay">First backoff delay; it doubles per retry, with jitter.</param>
/// <param name="MaxDelay">No wait (backoff or Retry-After) is longer than this.</param>
/// <param name="AttemptTimeout">Each request gets this long before it is abandoned and retried.</param>
/// <param name="RequestsPerMinute">Optional cap on requests started per minute.</param>
/// <param name="TokensPerMinute">Optional cap on tokens per minute, estimated before each request from the prompt length and the tokens asked for.</param>
public sealed record CallResilienceOptions(
    int MaxRetries,
    TimeSpan BaseDelay,
    TimeSpan MaxDelay,
    TimeSpan AttemptTimeout,
    int? RequestsPerMinute = null,
    int? TokensPerMinute = null)
{
    /// <summary>Four retries from 1 s doubling (common practice for hosted endpoints), at most 60 s between
    /// attempts, 60 s per attempt.</summary>
    public static CallResilienceOptions Default { get; } =
        new(4, TimeSpan.FromSeconds(1), TimeSpan.FromSeconds(60), TimeSpan.FromSeconds(60));
}
