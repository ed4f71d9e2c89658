namespace Plumbline.Nli;

/// <summary>
/// What the scorer needs to know about a model directory, read from our nli-model.json or, for a model
/// brought from elsewhere, from its config.json (and tokenizer_config.json when present).
/// </summary>
/// <param name="Name">Model name shown in reports.</param>
/// <param name="Architecture">Encoder family as written in the file (bert, roberta, deberta, ...).</param>
/// <param name="Tokenizer">Which tokenizer the vocabulary files call for.</param>
/// <param name="VocabularyFile">Full path of vocab.txt (WordPiece), vocab.json (byte-level BPE) or the SentencePiece model file.</param>
/// <param name="MergesFile">Full path of merges.txt for byte-level BPE; null for WordPiece.</param>
/// <param name="LowerCase">Whether text is lower-cased (and, for WordPiece, stripped of accents) before tokenising.</param>
/// <param name="MaxLength">Most tokens per pair, special tokens included; longer pairs are truncated.</param>
/// <param name="Labels">The model's output classes, in output order.</param>
/// <param name="OutputName">Graph output holding the logits; null means the first output.</param>
/// <param name="SourceFile">The file these facts were read from.</param>
/// <param name="Temperature">Logits are divided by this before the softmax (temperature scaling fitted on held-out
/// pairs, so the probabilities mean what they say); 1 when the model states none.</param>
/// <param name="VocabularySize">Rows of the model's token embedding table (config.json vocab_size), when known.</param>
/// <param name="TypeVocabularySize">Rows of its segment embedding table (config.json type_vocab_size), when known.</param>
/// <param name="PaddingId">The padding token id the model was trained with (config.json pad_token_id), when known.</param>
public sealed record NliModelCard(
    string Name,
    string Architecture,
    NliTokenizerKind Tokenizer,
    string VocabularyFile,
    string? MergesFile,
    bool LowerCase,
    int MaxLength,
    IReadOnlyList<string> Labels,
    string? OutputName,
    string SourceFile,
    double Temperature = 1.0,
    long? VocabularySize = null,
    long? TypeVocabularySize = null,
    long? PaddingId = null);
