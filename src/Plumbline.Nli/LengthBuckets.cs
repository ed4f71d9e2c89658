using Plumbline.Nli.Tokenization;

namespace Plumbline.Nli;

/// <summary>
/// Groups encoded pairs into batches of similar length: sorted by token count (stable, so equal lengths keep
/// their order), then cut into batches of at most batchSize. Each batch pads only to its own longest pair.
/// </summary>
internal static class LengthBuckets
{
    /// <summary>Indices into <paramref name="encoded"/>, one array per batch.</summary>
    public static int[][] Plan(IReadOnlyList<EncodedPair> encoded, int batchSize) =>
        Enumerable.Range(0, encoded.Count)
            .OrderBy(index => encoded[index].Length)
            .Chunk(batchSize)
            .ToArray();
}
