namespace Plumbline.Nli;

public sealed record NliScorerOptions
{
    /// <summary>Pairs per session run. Pairs are sorted by length first, so each batch pads little.</summary>
    public int BatchSize { get; init; } = 32;

    /// <summary>Keep scored pairs for reuse; statements recur across a run's trees and stability samples.</summary>
    public bool Cache { get; init; } = true;

    /// <summary>
    /// Most pairs the cache holds (about 130 bytes each: the pair is kept as a 128-bit hash, not its two strings).
    /// Pairs recur within a claim's stability samples and between nearby claims, rarely across a whole run, so the
    /// cache holds the trees of the claims in flight and a few more: 20,000 pairs, about 2.5 MiB, is 58 full-size
    /// trees (342 ordered pairs each). A larger cache made a long run's memory grow with its claim file until it
    /// was full (200,000 pairs, 25 MiB, is reached only after some 30,000 small trees).
    /// </summary>
    public int CacheCapacity { get; init; } = 20_000;
}
