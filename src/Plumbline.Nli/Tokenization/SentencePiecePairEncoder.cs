namespace Plumbline.Nli.Tokenization;

/// <summary>
/// Pairs over a SentencePiece model (spm.model, sentencepiece.bpe.model, ...). The special pieces the model holds
/// decide the frame and the ids:
/// <list type="bullet">
/// <item>[CLS] and [SEP] (DeBERTa-v2/v3 style): "[CLS] a [SEP] b [SEP]", segment ids 0 then 1, ids as in the file.</item>
/// <item>&lt;s&gt;, &lt;/s&gt; and &lt;pad&gt;: "&lt;s&gt; a &lt;/s&gt;&lt;/s&gt; b &lt;/s&gt;", ids as in the file.</item>
/// <item>&lt;unk&gt;=0, &lt;s&gt;=1, &lt;/s&gt;=2 and no &lt;pad&gt; (XLM-R style): the model was trained with a fairseq
/// dictionary that puts &lt;s&gt;=0 &lt;pad&gt;=1 &lt;/s&gt;=2 &lt;unk&gt;=3 first, so every other piece moves up by
/// one; same frame as above.</item>
/// </list>
/// </summary>
internal sealed class SentencePiecePairEncoder : IPairEncoder
{
    // The fairseq dictionary's own ids for its four special symbols (common practice for XLM-R style models).
    private const int FairseqStart = 0;
    private const int FairseqPadding = 1;
    private const int FairseqEnd = 2;
    private const int FairseqUnknown = 3;

    private readonly SentencePieceSegmenter segmenter;
    private readonly PairLayout layout;
    private readonly bool fairseqIds;
    private readonly bool lowerCase;
    private readonly int maxLength;

    private SentencePiecePairEncoder(SentencePieceSegmenter segmenter, PairLayout layout, long paddingId, bool fairseqIds, int vocabularySize, bool lowerCase, int maxLength)
    {
        this.segmenter = segmenter;
        this.layout = layout;
        PaddingId = paddingId;
        this.fairseqIds = fairseqIds;
        VocabularySize = vocabularySize;
        this.lowerCase = lowerCase;
        this.maxLength = maxLength;
    }

    public long PaddingId { get; }

    public int VocabularySize { get; }

    public int SegmentCount => layout.SecondSegmentHasOwnType ? 2 : 1;

    public static SentencePiecePairEncoder Create(string modelFile, bool lowerCase, int maxLength)
    {
        var file = SentencePieceModelFile.Read(modelFile);
        var segmenter = SentencePieceSegmenter.Create(file);
        var special = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var id = file.Pieces.Count - 1; id >= 0; id--)
        {
            if (file.Pieces[id].Type != SentencePieceType.Normal)
            {
                special[file.Pieces[id].Text] = id;
            }
        }

        var count = file.Pieces.Count;
        if (special.TryGetValue("[CLS]", out var classification) && special.TryGetValue("[SEP]", out var separator))
        {
            var layout = new PairLayout(classification, separator, DoubleSeparator: false, SecondSegmentHasOwnType: true);
            return new SentencePiecePairEncoder(segmenter, layout, special.GetValueOrDefault("[PAD]"), fairseqIds: false, count, lowerCase, maxLength);
        }

        if (special.TryGetValue("<s>", out var start) && special.TryGetValue("</s>", out var end))
        {
            if (special.TryGetValue("<pad>", out var padding))
            {
                var layout = new PairLayout(start, end, DoubleSeparator: true, SecondSegmentHasOwnType: false);
                return new SentencePiecePairEncoder(segmenter, layout, padding, fairseqIds: false, count, lowerCase, maxLength);
            }

            if (segmenter.UnknownId == 0 && start == 1 && end == 2)
            {
                var layout = new PairLayout(FairseqStart, FairseqEnd, DoubleSeparator: true, SecondSegmentHasOwnType: false);
                return new SentencePiecePairEncoder(segmenter, layout, FairseqPadding, fairseqIds: true, count + 1, lowerCase, maxLength);
            }

            throw new NliModelException(modelFile, $"has <s> (id {start}) and </s> (id {end}) but no <pad> piece, and not the <unk>=0 <s>=1 </s>=2 layout that a fairseq dictionary shifts by one; cannot tell the model's ids");
        }

        throw new NliModelException(modelFile, "has neither [CLS] and [SEP] nor <s> and </s> pieces to frame a sentence pair");
    }

    public EncodedPair Frame(IReadOnlyList<int> premise, IReadOnlyList<int> hypothesis) =>
        layout.Frame(premise, hypothesis, maxLength);

    public IReadOnlyList<int> Tokenize(string text)
    {
        var ids = segmenter.Encode(lowerCase ? text.ToLowerInvariant() : text);
        if (fairseqIds)
        {
            for (var i = 0; i < ids.Count; i++)
            {
                ids[i] = ids[i] == segmenter.UnknownId ? FairseqUnknown : ids[i] + 1;
            }
        }

        return ids;
    }
}
