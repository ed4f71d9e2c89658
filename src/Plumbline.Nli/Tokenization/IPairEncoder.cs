namespace Plumbline.Nli.Tokenization;

/// <summary>Turns a (premise, hypothesis) pair into the token layout one model family expects.</summary>
internal interface IPairEncoder
{
    /// <summary>Token id that fills the tail of shorter pairs in a padded batch.</summary>
    long PaddingId { get; }

    /// <summary>One more than the highest token id the encoder can write: the rows the model's embedding table needs.</summary>
    int VocabularySize { get; }

    /// <summary>Distinct segment (token type) ids the encoder writes: 2 for the [CLS] a [SEP] b [SEP] frame, else 1.</summary>
    int SegmentCount { get; }

    EncodedPair Encode(string premise, string hypothesis);
}
