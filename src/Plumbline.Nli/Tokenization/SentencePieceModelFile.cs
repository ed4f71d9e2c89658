using Google.Protobuf;

namespace Plumbline.Nli.Tokenization;

/// <summary>
/// The facts the pair encoder needs from a SentencePiece model file (a serialised ModelProto, as the public
/// sentencepiece_model.proto describes it): the pieces with their scores and types, and the algorithm.
/// </summary>
internal sealed class SentencePieceModelFile
{
    // Field numbers of sentencepiece_model.proto.
    private const int PiecesField = 1;
    private const int TrainerSpecField = 2;
    private const int PieceTextField = 1;
    private const int PieceScoreField = 2;
    private const int PieceTypeField = 3;
    private const int ModelTypeField = 3;
    private const int ByteFallbackField = 35;

    private SentencePieceModelFile(string path, byte[] bytes, IReadOnlyList<SentencePiece> pieces, SentencePieceAlgorithm algorithm, bool byteFallback)
    {
        Path = path;
        Bytes = bytes;
        Pieces = pieces;
        Algorithm = algorithm;
        ByteFallback = byteFallback;
    }

    public string Path { get; }

    /// <summary>The file as read, for Microsoft.ML.Tokenizers to load.</summary>
    public byte[] Bytes { get; }

    /// <summary>Pieces by id.</summary>
    public IReadOnlyList<SentencePiece> Pieces { get; }

    public SentencePieceAlgorithm Algorithm { get; }

    public bool ByteFallback { get; }

    public static SentencePieceModelFile Read(string path)
    {
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new NliModelException(path, e is FileNotFoundException or DirectoryNotFoundException ? "SentencePiece model file not found" : $"cannot read: {e.Message}", e);
        }

        try
        {
            var pieces = new List<SentencePiece>();
            var algorithm = SentencePieceAlgorithm.Unigram;
            var byteFallback = false;
            var input = new CodedInputStream(bytes);
            for (var tag = input.ReadTag(); tag != 0; tag = input.ReadTag())
            {
                switch (WireFormat.GetTagFieldNumber(tag))
                {
                    case PiecesField when WireFormat.GetTagWireType(tag) == WireFormat.WireType.LengthDelimited:
                        pieces.Add(ReadPiece(input.ReadBytes()));
                        break;
                    case TrainerSpecField when WireFormat.GetTagWireType(tag) == WireFormat.WireType.LengthDelimited:
                        // A message field given twice is merged, later values winning, so read each occurrence in turn.
                        (algorithm, byteFallback) = ReadTrainerSpec(input.ReadBytes(), algorithm, byteFallback);
                        break;
                    default:
                        input.SkipLastField();
                        break;
                }
            }

            if (pieces.Count == 0)
            {
                throw new NliModelException(path, "not a SentencePiece model: it holds no pieces");
            }

            return new SentencePieceModelFile(path, bytes, pieces, algorithm, byteFallback);
        }
        catch (InvalidProtocolBufferException e)
        {
            throw new NliModelException(path, $"not a SentencePiece model: {e.Message}", e);
        }
    }

    /// <summary>
    /// The same model declared as Unigram. Microsoft.ML.Tokenizers 2.0.1 applies the model's normalisation rules
    /// (its precompiled NFKC map) only when encoding on its Unigram path, so the BPE encoder takes the normalised
    /// text from this twin.
    /// A repeated message field is merged into the first one, so appending a trainer spec that holds only the
    /// model type changes nothing else.
    /// </summary>
    public byte[] AsUnigram()
    {
        using var trainerSpec = new MemoryStream();
        var inner = new CodedOutputStream(trainerSpec);
        inner.WriteTag(ModelTypeField, WireFormat.WireType.Varint);
        inner.WriteEnum((int)SentencePieceAlgorithm.Unigram);
        inner.Flush();

        using var twin = new MemoryStream();
        twin.Write(Bytes);
        var outer = new CodedOutputStream(twin);
        outer.WriteTag(TrainerSpecField, WireFormat.WireType.LengthDelimited);
        outer.WriteBytes(ByteString.CopyFrom(trainerSpec.ToArray()));
        outer.Flush();
        return twin.ToArray();
    }

    private static SentencePiece ReadPiece(ByteString message)
    {
        var text = "";
        var score = 0f;
        var type = SentencePieceType.Normal;
        var input = message.CreateCodedInput();
        for (var tag = input.ReadTag(); tag != 0; tag = input.ReadTag())
        {
            switch (WireFormat.GetTagFieldNumber(tag))
            {
                case PieceTextField:
                    text = input.ReadString();
                    break;
                case PieceScoreField:
                    score = input.ReadFloat();
                    break;
                case PieceTypeField:
                    type = (SentencePieceType)input.ReadEnum();
                    break;
                default:
                    input.SkipLastField();
                    break;
            }
        }

        return new SentencePiece(text, score, type);
    }

    private static (SentencePieceAlgorithm Algorithm, bool ByteFallback) ReadTrainerSpec(ByteString message, SentencePieceAlgorithm algorithm, bool byteFallback)
    {
        var input = message.CreateCodedInput();
        for (var tag = input.ReadTag(); tag != 0; tag = input.ReadTag())
        {
            switch (WireFormat.GetTagFieldNumber(tag))
            {
                case ModelTypeField:
                    algorithm = (SentencePieceAlgorithm)input.ReadEnum();
                    break;
                case ByteFallbackField:
                    byteFallback = input.ReadBool();
                    break;
                default:
                    input.SkipLastField();
                    break;
            }
        }

        return (algorithm, byteFallback);
    }
}
