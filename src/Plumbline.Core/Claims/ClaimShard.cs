using System.Buffers.Binary;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;

namespace Plumbline.Core.Claims;

/// <summary>
/// One of <see cref="Count"/> disjoint parts of a claim input, chosen by the claim's id alone: a claim belongs to
/// shard <c>1 + (h mod N)</c>, where h is the first eight bytes, read big-endian as an unsigned number, of the
/// SHA-256 digest of the id's UTF-8 bytes. SHA-256 (FIPS 180-4) gives the same digest on every machine, runtime and
/// .NET version, unlike <see cref="string.GetHashCode()"/>, which is randomised per process; so every worker of a
/// CI matrix picks the same claims, and a rerun picks them again.
/// </summary>
/// <param name="Index">Which shard, from 1 to <paramref name="Count"/>.</param>
/// <param name="Count">How many shards the input is split into.</param>
public sealed record ClaimShard(int Index, int Count)
{
    /// <summary>More shards than this is a typo, not a plan.</summary>
    public const int MaxCount = 10_000;

    /// <summary>The shard <paramref name="claimId"/> belongs to when the input is split into <paramref name="count"/>.</summary>
    public static int Of(string claimId, int count)
    {
        ArgumentNullException.ThrowIfNull(claimId);
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 1);
        Span<byte> digest = stackalloc byte[SHA256.HashSizeInBytes];
        SHA256.HashData(Encoding.UTF8.GetBytes(claimId), digest);
        return (int)(BinaryPrimitives.ReadUInt64BigEndian(digest) % (ulong)count) + 1;
    }

    /// <summary>True when <paramref name="claimId"/> belongs to this shard.</summary>
    public bool Contains(string claimId) => Of(claimId, Count) == Index;

    /// <summary>Reads "K/N" with 1 &lt;= K &lt;= N.</summary>
    /// <exception cref="FormatException">The text is not such a pair; the message says what is wrong.</exception>
    public static ClaimShard Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var parts = text.Split('/');
        if (parts.Length != 2
            || !int.TryParse(parts[0].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var index)
            || !int.TryParse(parts[1].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var count))
        {
            throw new FormatException($"'{text}' is not K/N (shard K of N, for example 2/5)");
        }

        if (count < 1 || count > MaxCount)
        {
            throw new FormatException($"'{text}': N must be from 1 to {MaxCount.ToString(CultureInfo.InvariantCulture)}");
        }

        if (index < 1 || index > count)
        {
            throw new FormatException($"'{text}': K must be from 1 to N ({count.ToString(CultureInfo.InvariantCulture)})");
        }

        return new ClaimShard(index, count);
    }

    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Index}/{Count}");
}
