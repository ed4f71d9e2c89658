using System.Text;
using Plumbline.Core.Language;

namespace Plumbline.Models.Cache;

/// <summary>
/// The key of one cached response: SHA-256 of who answers (<see cref="ModelIdentity"/>), the canonical
/// request (purpose, subject, answer, n, every decoding setting, sample index, prompt version) and the
/// rendered prompt itself, so a prompt that changes without a version bump still misses the cache.
/// </summary>
public static class ResponseCacheKey
{
    public static string Of(ModelIdentity identity, RequestFingerprint request, string prompt)
    {
        ArgumentNullException.ThrowIfNull(identity);
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(prompt);
        var json = new StringBuilder(identity.CanonicalJson.Length + request.CanonicalJson.Length + prompt.Length + 64);
        json.Append('{');
        CanonicalJsonWriter.Field(json, "identity", first: true); json.Append(identity.CanonicalJson);
        CanonicalJsonWriter.Field(json, "request"); json.Append(request.CanonicalJson);
        CanonicalJsonWriter.Field(json, "prompt"); CanonicalJsonWriter.Text(json, prompt);
        json.Append('}');
        return RequestFingerprint.HashOf(json.ToString());
    }
}
