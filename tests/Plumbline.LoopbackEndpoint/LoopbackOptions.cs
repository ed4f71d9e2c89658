namespace Plumbline.LoopbackEndpoint;

/// <summary>How the loopback endpoint behaves.</summary>
/// <param name="Delay">Every response waits this long first (the latency of a real endpoint).</param>
/// <param name="Logprobs">Answer requests get log-probabilities when they ask for them.</param>
/// <param name="Models">Model names it serves; any name when null.</param>
/// <param name="RequiredKey">The bearer key it demands; none when null.</param>
/// <param name="SlowBy">How late a <see cref="Fault.Slow"/> response comes.</param>
/// <param name="RetryAfterSeconds">The Retry-After of a 429.</param>
public sealed record LoopbackOptions(
    TimeSpan Delay = default,
    bool Logprobs = true,
    IReadOnlyList<string>? Models = null,
    string? RequiredKey = null,
    TimeSpan? SlowBy = null,
    int RetryAfterSeconds = 1)
{
    public ScriptedAnswers Answers { get; init; } = new();

    public FaultPlan Faults { get; init; } = FaultPlans.None;
}
