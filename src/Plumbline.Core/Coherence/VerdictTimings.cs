using System.Text.Json.Serialization;

namespace Plumbline.Core.Coherence;

/// <summary>Where the time of one claim went.</summary>
public sealed record VerdictTimings(TimeSpan Tree, TimeSpan Nli, TimeSpan Solve)
{
    public static VerdictTimings None { get; } = new(TimeSpan.Zero, TimeSpan.Zero, TimeSpan.Zero);

    [JsonIgnore]
    public TimeSpan Total => Tree + Nli + Solve;
}
