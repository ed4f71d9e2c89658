namespace Plumbline.Nli.Tokenization;

/// <summary>Turns a (premise, hypothesis) pair into the token layout one model family expects.</summary>
internal interface IPairEncoder
{
    /// <summary>Token id that fills the tail of shorter pairs in a padded batch.</summary>
    long PaddingId { get; }

    EncodedPair Encode(string premise, string hypothesis);
}
