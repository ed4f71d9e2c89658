using Microsoft.ML.Tokenizers;

namespace Plumbline.Nli.Tokenization;

/// <summary>
/// Text to SentencePiece ids, equal to what the sentencepiece library's own encoder returns for the model.
/// Unigram models are segmented by Microsoft.ML.Tokenizers. For BPE models Microsoft.ML.Tokenizers 2.0.1 skips
/// the model's normalisation rules and drops one-character texts, so there it only normalises, on its Unigram
/// path (see <see cref="SentencePieceModelFile.AsUnigram"/>), and <see cref="SentencePieceBpeMerges"/> segments.
/// </summary>
internal sealed class SentencePieceSegmenter
{
    private readonly SentencePieceTokenizer library;
    private readonly SentencePieceBpeMerges? bpe;

    private SentencePieceSegmenter(SentencePieceTokenizer library, SentencePieceBpeMerges? bpe, int unknownId)
    {
        this.library = library;
        this.bpe = bpe;
        UnknownId = unknownId;
    }

    public int UnknownId { get; }

    public static SentencePieceSegmenter Create(SentencePieceModelFile file)
    {
        if (file.Algorithm is not (SentencePieceAlgorithm.Unigram or SentencePieceAlgorithm.Bpe))
        {
            throw new NliModelException(file.Path, $"SentencePiece model type {file.Algorithm} is not supported; Unigram and BPE are");
        }

        // No NLI export in common use falls back to bytes, and sentencepiece then writes no unknown id at all.
        if (file.ByteFallback)
        {
            throw new NliModelException(file.Path, "SentencePiece models with byte fallback are not supported");
        }

        var unknown = file.Pieces.Select((piece, id) => (piece, id)).Where(entry => entry.piece.Type == SentencePieceType.Unknown).ToArray();
        if (unknown.Length != 1)
        {
            throw new NliModelException(file.Path, $"a SentencePiece model needs exactly one unknown piece; this one has {unknown.Length}");
        }

        var unknownId = unknown[0].id;
        if (file.Algorithm == SentencePieceAlgorithm.Unigram)
        {
            return new SentencePieceSegmenter(Load(file, file.Bytes), null, unknownId);
        }

        if (file.Pieces.Any(piece => piece.Type == SentencePieceType.Unused))
        {
            throw new NliModelException(file.Path, "SentencePiece BPE models with unused pieces are not supported");
        }

        return new SentencePieceSegmenter(Load(file, file.AsUnigram()), new SentencePieceBpeMerges(file.Pieces, unknownId), unknownId);
    }

    public List<int> Encode(string text)
    {
        List<int> ids;
        if (bpe is null)
        {
            ids = [.. library.EncodeToIds(text, addBeginningOfSentence: false, addEndOfSentence: false)];
        }
        else
        {
            // The Unigram twin's encoder hands back the text as it normalised it; its segmentation is not used.
            library.EncodeToTokens(text, out var normalized, addBeginningOfSentence: false, addEndOfSentence: false);
            ids = bpe.Encode(normalized ?? "");
        }

        MergeUnknownRuns(ids);
        return ids;
    }

    /// <summary>sentencepiece writes a run of adjacent unknown pieces as one unknown id.</summary>
    private void MergeUnknownRuns(List<int> ids)
    {
        var kept = 0;
        for (var i = 0; i < ids.Count; i++)
        {
            if (ids[i] != UnknownId || kept == 0 || ids[kept - 1] != UnknownId)
            {
                ids[kept++] = ids[i];
            }
        }

        ids.RemoveRange(kept, ids.Count - kept);
    }

    private static SentencePieceTokenizer Load(SentencePieceModelFile file, byte[] bytes)
    {
        try
        {
            using var stream = new MemoryStream(bytes, writable: false);
            return SentencePieceTokenizer.Create(stream, addBeginningOfSentence: false, addEndOfSentence: false);
        }
        catch (Exception e) when (e is ArgumentException or FormatException or InvalidOperationException or IndexOutOfRangeException
            or Google.Protobuf.InvalidProtocolBufferException)
        {
            throw new NliModelException(file.Path, $"Microsoft.ML.Tokenizers cannot load this SentencePiece model: {e.Message.Split('\n')[0].Trim()}", e);
        }
    }
}
