namespace Plumbline.Nli.Tokenization;

/// <summary>How a SentencePiece model segments text, numbered as in sentencepiece_model.proto.</summary>
internal enum SentencePieceAlgorithm
{
    Unigram = 1,
    Bpe = 2,
    Word = 3,
    Char = 4,
}
