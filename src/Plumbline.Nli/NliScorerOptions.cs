namespace Plumbline.Nli;

public sealed record NliScorerOptions
{
    /// <summary>Pairs per session run. Pairs are sorted by length first, so each batch pads little.</summary>
    public int BatchSize { get; init; } = 32;

    /// <summary>Keep scored pairs for reuse; statements recur across a run's trees and stability samples.</summary>
    public bool Cache { get; init; } = true;

    /// <summary>
    /// Most pairs the cache holds (about 130 bytes each: the pair is kept as a 128-bit hash, not its two strings),
    /// so a long run's memory stays flat: 200,000 pairs, about 25 MiB, is a few hundred full-size trees (342
    /// ordered pairs each).
    /// </summary>
    public int CacheCapacity { get; init; } = 200_000;
}
