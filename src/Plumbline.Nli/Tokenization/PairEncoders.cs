namespace Plumbline.Nli.Tokenization;

internal static class PairEncoders
{
    public static IPairEncoder For(NliModelCard card) => card.Tokenizer switch
    {
        NliTokenizerKind.ByteLevelBpe => ByteLevelBpePairEncoder.Create(card.VocabularyFile, card.MergesFile!, card.LowerCase, card.MaxLength),
        _ => WordPiecePairEncoder.Create(card.VocabularyFile, card.LowerCase, card.MaxLength),
    };
}
