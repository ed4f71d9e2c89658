namespace Plumbline.Models.Cache;

/// <summary>What the cache holds for one model identity, as <c>plumb cache inspect</c> lists it.</summary>
/// <param name="Key">The identity's hash; a unique prefix of it names the identity in other cache commands.</param>
/// <param name="Identity">The identity's canonical JSON.</param>
/// <param name="Generations">Cached texts.</param>
/// <param name="Answers">Cached answer probabilities.</param>
/// <param name="Oldest">When the oldest entry was stored.</param>
/// <param name="Newest">When the newest entry was stored.</param>
public sealed record CachedIdentity(string Key, string Identity, int Generations, int Answers, DateTimeOffset Oldest, DateTimeOffset Newest);
