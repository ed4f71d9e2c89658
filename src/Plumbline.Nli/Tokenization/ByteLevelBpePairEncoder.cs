using System.Text.RegularExpressions;
using Microsoft.ML.Tokenizers;

namespace Plumbline.Nli.Tokenization;

/// <summary>
/// Byte-level BPE over vocab.json and merges.txt, as RoBERTa-style encoders use. The frame follows the
/// special tokens the vocabulary holds: &lt;s&gt;/&lt;/s&gt; gives the RoBERTa frame, [CLS]/[SEP] the BERT frame.
/// </summary>
internal sealed partial class ByteLevelBpePairEncoder : IPairEncoder
{
    private readonly BpeTokenizer tokenizer;
    private readonly PairLayout layout;
    private readonly bool lowerCase;
    private readonly int maxLength;

    private ByteLevelBpePairEncoder(BpeTokenizer tokenizer, PairLayout layout, long paddingId, bool lowerCase, int maxLength)
    {
        this.tokenizer = tokenizer;
        this.layout = layout;
        PaddingId = paddingId;
        this.lowerCase = lowerCase;
        this.maxLength = maxLength;
    }

    public long PaddingId { get; }

    public int VocabularySize => tokenizer.Vocabulary.Values.Max() + 1;

    public int SegmentCount => layout.SecondSegmentHasOwnType ? 2 : 1;

    public static ByteLevelBpePairEncoder Create(string vocabularyFile, string mergesFile, bool lowerCase, int maxLength)
    {
        var tokenizer = Open(vocabularyFile, mergesFile);
        var vocabulary = tokenizer.Vocabulary;
        if (vocabulary.TryGetValue("<s>", out var start) && vocabulary.TryGetValue("</s>", out var end))
        {
            var padding = vocabulary.TryGetValue("<pad>", out var pad) ? pad : end;
            return new ByteLevelBpePairEncoder(tokenizer, new PairLayout(start, end, DoubleSeparator: true, SecondSegmentHasOwnType: false), padding, lowerCase, maxLength);
        }

        if (vocabulary.TryGetValue("[CLS]", out var classification) && vocabulary.TryGetValue("[SEP]", out var separator))
        {
            var padding = vocabulary.TryGetValue("[PAD]", out var pad) ? pad : 0;
            return new ByteLevelBpePairEncoder(tokenizer, new PairLayout(classification, separator, DoubleSeparator: false, SecondSegmentHasOwnType: true), padding, lowerCase, maxLength);
        }

        throw new NliModelException(vocabularyFile, "vocabulary has neither <s> and </s> nor [CLS] and [SEP] to frame a sentence pair");
    }

    public IReadOnlyList<int> Tokenize(string text) =>
        tokenizer.EncodeToIds(lowerCase ? text.ToLowerInvariant() : text);

    public EncodedPair Frame(IReadOnlyList<int> premise, IReadOnlyList<int> hypothesis) =>
        layout.Frame(premise, hypothesis, maxLength);

    private static BpeTokenizer Open(string vocabularyFile, string mergesFile)
    {
        foreach (var file in new[] { vocabularyFile, mergesFile })
        {
            if (!File.Exists(file))
            {
                throw new NliModelException(file, "tokenizer file not found");
            }
        }

        try
        {
            return BpeTokenizer.Create(new BpeOptions(vocabularyFile, mergesFile)
            {
                ByteLevel = true,
                PreTokenizer = new RegexPreTokenizer(WordSplitter(), specialTokens: null),
            });
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or FormatException
            or InvalidOperationException or System.Text.Json.JsonException)
        {
            throw new NliModelException(vocabularyFile, $"vocab.json and merges.txt do not make a byte-level BPE tokenizer: {e.Message.Split('\n')[0].Trim()}", e);
        }
    }

    // The byte-level BPE word split (common practice): English contractions, letter runs, digit runs and other
    // symbols each with at most one leading space, then whitespace.
    [GeneratedRegex(@"'s|'t|'re|'ve|'m|'ll|'d| ?\p{L}+| ?\p{N}+| ?[^\s\p{L}\p{N}]+|\s+(?!\S)|\s+")]
    private static partial Regex WordSplitter();
}
