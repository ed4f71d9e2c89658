namespace Plumbline.Core.Language;

/// <summary>
/// The most model calls and tokens a run may spend. A call is refused once either is used up; the
/// refusal trips <see cref="Exhausted"/>, which the run loop links into its cancellation so that the
/// run stops as it would on an interrupt: finished verdicts kept, unjudged claims listed. Calls already
/// in flight are let finish, so a claim that needs no more calls still completes. Safe for concurrent use.
/// </summary>
public sealed class CallBudget : IDisposable
{
    private readonly Lock gate = new();
    private readonly CancellationTokenSource exhausted = new();
    private int calls;
    private long tokens;
    private string? reason;

    public CallBudget(int? maxCalls, long? maxTokens)
    {
        if (maxCalls is < 0 || maxTokens is < 0)
        {
            throw new ArgumentOutOfRangeException(maxCalls is < 0 ? nameof(maxCalls) : nameof(maxTokens), "a budget cannot be negative");
        }

        MaxCalls = maxCalls;
        MaxTokens = maxTokens;
    }

    public int? MaxCalls { get; }

    public long? MaxTokens { get; }

    /// <summary>Cancelled once a call has been refused.</summary>
    public CancellationToken Exhausted => exhausted.Token;

    /// <summary>Why the budget stopped the run ("the budget of 100 model calls is spent"); null while it has not.</summary>
    public string? Reason
    {
        get
        {
            lock (gate)
            {
                return reason;
            }
        }
    }

    public int Calls
    {
        get
        {
            lock (gate)
            {
                return calls;
            }
        }
    }

    public long Tokens
    {
        get
        {
            lock (gate)
            {
                return tokens;
            }
        }
    }

    /// <summary>Counts one call if the budget allows it; otherwise trips <see cref="Exhausted"/> and returns false.</summary>
    public bool TryStartCall()
    {
        string? refused = null;
        lock (gate)
        {
            if (MaxCalls is { } maxCalls && calls >= maxCalls)
            {
                refused = $"the budget of {maxCalls} model calls is spent";
            }
            else if (MaxTokens is { } maxTokens && tokens >= maxTokens)
            {
                refused = $"the budget of {maxTokens} tokens is spent";
            }
            else
            {
                calls++;
                return true;
            }

            reason ??= refused;
        }

        exhausted.Cancel();
        return false;
    }

    /// <summary>Adds what a finished call used.</summary>
    public void Spend(TokenUsage usage)
    {
        lock (gate)
        {
            tokens += usage.Total;
        }
    }

    public void Dispose() => exhausted.Dispose();
}
