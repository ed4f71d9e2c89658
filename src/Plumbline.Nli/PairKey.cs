using System.IO.Hashing;
using System.Runtime.InteropServices;
using Plumbline.Core.Entailment;

namespace Plumbline.Nli;

/// <summary>
/// A pair's 128-bit XxHash of both texts, the cache's key in place of the two strings: a long run's cache then
/// holds no statement text, so its memory does not depend on how long the statements are. The premise's length
/// is hashed between the texts, so ("ab", "c") and ("a", "bc") differ. Two distinct pairs share a key with
/// probability about n² / 2¹²⁹, nothing at a cache's size (common practice for 128-bit content hashes).
/// </summary>
internal static class PairKey
{
    public static UInt128 Of(SentencePair pair)
    {
        var hash = new XxHash128();
        hash.Append(MemoryMarshal.AsBytes(pair.Premise.AsSpan()));
        Span<byte> length = stackalloc byte[sizeof(int)];
        BitConverter.TryWriteBytes(length, pair.Premise.Length);
        hash.Append(length);
        hash.Append(MemoryMarshal.AsBytes(pair.Hypothesis.AsSpan()));
        return hash.GetCurrentHashAsUInt128();
    }
}
