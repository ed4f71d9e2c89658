namespace Plumbline.Nli;

public sealed record NliScorerOptions
{
    /// <summary>Pairs per session run. Pairs are sorted by length first, so each batch pads little.</summary>
    public int BatchSize { get; init; } = 32;

    /// <summary>Keep every pair's scores for the scorer's lifetime; statements recur across a run's trees.</summary>
    public bool Cache { get; init; } = true;
}
