namespace Plumbline.Core.Claims;

/// <summary>A statement a user wants judged true or false.</summary>
/// <param name="Id">Stable identifier (from the claim file, or generated for ad-hoc claims).</param>
/// <param name="Text">The claim as the user wrote it.</param>
/// <param name="Gold">The known truth value when the file carries one; null otherwise.</param>
/// <param name="Tags">Free-form labels for grouping in reports.</param>
public sealed record Claim(string Id, string Text, bool? Gold = null, IReadOnlyList<string>? Tags = null)
{
    public IReadOnlyList<string> Tags { get; init; } = Tags ?? [];
}
