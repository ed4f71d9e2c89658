namespace Plumbline.Core.Language;

/// <summary>
/// The most model calls and tokens a run may spend. A call is refused once either is used up (the
/// model decorator that asks then halts the run, see <see cref="Runs.RunHaltedException"/>); calls
/// already in flight are let finish, so a claim that needs no more calls still completes. Safe for
/// concurrent use.
/// </summary>
public sealed class CallBudget
{
    private readonly Lock gate = new();
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

    /// <summary>Counts one call if the budget allows it; otherwise records <see cref="Reason"/> and returns false.</summary>
    public bool TryStartCall()
    {
        lock (gate)
        {
            if (MaxCalls is { } maxCalls && calls >= maxCalls)
            {
                reason ??= $"the budget of {maxCalls} model calls is spent";
                return false;
            }

            if (MaxTokens is { } maxTokens && tokens >= maxTokens)
            {
                reason ??= $"the budget of {maxTokens} tokens is spent";
                return false;
            }

            calls++;
            return true;
        }
    }

    /// <summary>Adds what a finished call used.</summary>
    public void Spend(TokenUsage usage)
    {
        lock (gate)
        {
            tokens += usage.Total;
        }
    }
}
