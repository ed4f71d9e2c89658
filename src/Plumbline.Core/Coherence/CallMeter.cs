using Plumbline.Core.Language;

namespace Plumbline.Core.Coherence;

/// <summary>
/// Counts model calls and tokens of one claim. Shared by concurrent requests, and kept outside the
/// tree builder so that a claim that fails half-way still reports what it spent.
/// </summary>
internal sealed class CallMeter
{
    private readonly Lock gate = new();
    private int calls;
    private TokenUsage tokens;
    private bool estimated;

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

    public TokenUsage Tokens
    {
        get
        {
            lock (gate)
            {
                return tokens;
            }
        }
    }

    /// <summary>True once any answer probability was estimated by sampling.</summary>
    public bool Estimated
    {
        get
        {
            lock (gate)
            {
                return estimated;
            }
        }
    }

    public void Started()
    {
        lock (gate)
        {
            calls++;
        }
    }

    public void Spent(TokenUsage usage, bool wasEstimated = false)
    {
        lock (gate)
        {
            tokens += usage;
            estimated |= wasEstimated;
        }
    }
}
