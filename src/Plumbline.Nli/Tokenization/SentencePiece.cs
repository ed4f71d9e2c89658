namespace Plumbline.Nli.Tokenization;

/// <summary>One entry of a SentencePiece model: its text (spaces written as U+2581), score and type.</summary>
internal sealed record SentencePiece(string Text, float Score, SentencePieceType Type);

/// <summary>Piece types as numbered in sentencepiece_model.proto.</summary>
internal enum SentencePieceType
{
    Normal = 1,
    Unknown = 2,
    Control = 3,
    UserDefined = 4,
    Unused = 5,
    Byte = 6,
}
