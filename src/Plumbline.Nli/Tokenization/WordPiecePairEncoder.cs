namespace Plumbline.Nli.Tokenization;

/// <summary>BERT-style pairs over vocab.txt: [CLS] premise [SEP] hypothesis [SEP], segment ids 0 then 1.</summary>
internal sealed class WordPiecePairEncoder : IPairEncoder
{
    private readonly WordPieceTokenizer tokenizer;
    private readonly PairLayout layout;
    private readonly int maxLength;

    private WordPiecePairEncoder(WordPieceTokenizer tokenizer, int maxLength)
    {
        this.tokenizer = tokenizer;
        this.maxLength = maxLength;
        var vocabulary = tokenizer.Vocabulary;
        layout = new PairLayout(vocabulary.Classification, vocabulary.Separator, DoubleSeparator: false, SecondSegmentHasOwnType: true);
        PaddingId = vocabulary.Padding;
    }

    public long PaddingId { get; }

    public int VocabularySize => tokenizer.Vocabulary.Size;

    public int SegmentCount => 2;

    public static WordPiecePairEncoder Create(string vocabularyFile, bool lowerCase, int maxLength) =>
        new(new WordPieceTokenizer(WordPieceVocabulary.Load(vocabularyFile), lowerCase), maxLength);

    public IReadOnlyList<int> Tokenize(string text) => tokenizer.Encode(text);

    public EncodedPair Frame(IReadOnlyList<int> premise, IReadOnlyList<int> hypothesis) =>
        layout.Frame(premise, hypothesis, maxLength);
}
