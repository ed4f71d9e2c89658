namespace Plumbline.Nli.Tokenization;

internal static class PairEncoders
{
    /// <summary>The card's tokenizer, checked against the embedding size and padding id config.json gives (when it gives them).</summary>
    public static IPairEncoder For(NliModelCard card)
    {
        IPairEncoder encoder = card.Tokenizer switch
        {
            NliTokenizerKind.ByteLevelBpe => ByteLevelBpePairEncoder.Create(card.VocabularyFile, card.MergesFile!, card.LowerCase, card.MaxLength),
            NliTokenizerKind.SentencePiece => SentencePiecePairEncoder.Create(card.VocabularyFile, card.LowerCase, card.MaxLength),
            _ => WordPiecePairEncoder.Create(card.VocabularyFile, card.LowerCase, card.MaxLength),
        };

        if (card.VocabularySize is { } rows && encoder.VocabularySize > rows)
        {
            throw new NliModelException(card.VocabularyFile, $"writes token ids up to {encoder.VocabularySize - 1}, but the model's vocab_size is {rows}: this tokenizer does not belong to this model");
        }

        // Each family pads with its own id ([PAD]=0, <pad>=1), so a tokenizer from another family shows here.
        if (card.PaddingId is { } padding && padding != encoder.PaddingId)
        {
            throw new NliModelException(card.VocabularyFile, $"pads with id {encoder.PaddingId}, but the model's pad_token_id is {padding}: this tokenizer does not belong to this model");
        }

        return encoder;
    }

    /// <summary>
    /// A graph that takes token_type_ids looks each one up in a table of type_vocab_size rows; a model with a
    /// single row cannot take the second segment's 1. (A model with none ignores the input.)
    /// </summary>
    public static void CheckSegments(IPairEncoder encoder, ModelInputs inputs, NliModelCard card, string modelFile)
    {
        if (inputs.TokenTypeIds && card.TypeVocabularySize is { } rows && rows > 0 && encoder.SegmentCount > rows)
        {
            throw new NliModelException(modelFile, $"takes token_type_ids, but the model's type_vocab_size is {rows} while the tokenizer writes segment ids 0 and 1 ([CLS] a [SEP] b [SEP])");
        }
    }
}
