namespace Plumbline.Nli.Tokenization;

/// <summary>One pair as model input: token ids, segment ids, and whether either side was cut to fit.</summary>
internal sealed record EncodedPair(long[] InputIds, long[] TypeIds, bool Truncated)
{
    public int Length => InputIds.Length;
}
