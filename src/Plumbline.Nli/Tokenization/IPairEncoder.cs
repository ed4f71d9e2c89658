namespace Plumbline.Nli.Tokenization;

/// <summary>
/// Turns a (premise, hypothesis) pair into the token layout one model family expects, in two steps so that a
/// statement met in many pairs is tokenised once: <see cref="Tokenize"/> one side, then <see cref="Frame"/> two.
/// </summary>
internal interface IPairEncoder
{
    /// <summary>Token id that fills the tail of shorter pairs in a padded batch.</summary>
    long PaddingId { get; }

    /// <summary>One more than the highest token id the encoder can write: the rows the model's embedding table needs.</summary>
    int VocabularySize { get; }

    /// <summary>Distinct segment (token type) ids the encoder writes: 2 for the [CLS] a [SEP] b [SEP] frame, else 1.</summary>
    int SegmentCount { get; }

    /// <summary>The token ids of one side, without special tokens or truncation.</summary>
    IReadOnlyList<int> Tokenize(string text);

    /// <summary>Frames two tokenised sides with the family's special tokens, cutting the longer side to fit.</summary>
    EncodedPair Frame(IReadOnlyList<int> premise, IReadOnlyList<int> hypothesis);
}

internal static class PairEncoderExtensions
{
    public static EncodedPair Encode(this IPairEncoder encoder, string premise, string hypothesis) =>
        encoder.Frame(encoder.Tokenize(premise), encoder.Tokenize(hypothesis));
}
