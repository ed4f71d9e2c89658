using Google.Protobuf;

namespace Plumbline.Nli.Tests.SentencePiece;

/// <summary>
/// Makes broken variants of a SentencePiece model file for the load-error tests, using the field numbers of the
/// public sentencepiece_model.proto: pieces are field 1 (text 1, score 2, type 3), the trainer spec field 2.
/// </summary>
internal static class SentencePieceModelEditor
{
    public const int NormalType = 1;
    public const int UnknownType = 2;
    public const int CharModelType = 4;
    public const int ModelTypeField = 3;
    public const int ByteFallbackField = 35;

    /// <summary>Rewrites each piece through <paramref name="edit"/> (id, text, type) and copies every other field as it is.</summary>
    public static byte[] EditPieces(byte[] model, Func<int, string, int, (string Text, int Type)> edit)
    {
        using var output = new MemoryStream();
        var input = new CodedInputStream(model);
        var id = 0;
        while (true)
        {
            var start = (int)input.Position;
            var tag = input.ReadTag();
            if (tag == 0)
            {
                break;
            }

            if (WireFormat.GetTagFieldNumber(tag) != 1)
            {
                input.SkipLastField();
                output.Write(model, start, (int)input.Position - start);
                continue;
            }

            var (text, score, type) = ReadPiece(input.ReadBytes());
            var (newText, newType) = edit(id++, text, type);
            WriteMessage(output, 1, piece =>
            {
                piece.WriteTag(1, WireFormat.WireType.LengthDelimited);
                piece.WriteString(newText);
                piece.WriteTag(2, WireFormat.WireType.Fixed32);
                piece.WriteFloat(score);
                piece.WriteTag(3, WireFormat.WireType.Varint);
                piece.WriteEnum(newType);
            });
        }

        return output.ToArray();
    }

    /// <summary>Appends a trainer spec holding one varint field; a repeated message field merges into the first.</summary>
    public static byte[] WithTrainerField(byte[] model, int field, int value)
    {
        using var output = new MemoryStream();
        output.Write(model);
        WriteMessage(output, 2, spec =>
        {
            spec.WriteTag(field, WireFormat.WireType.Varint);
            spec.WriteInt32(value);
        });
        return output.ToArray();
    }

    private static (string Text, float Score, int Type) ReadPiece(ByteString message)
    {
        var (text, score, type) = ("", 0f, NormalType);
        var input = message.CreateCodedInput();
        for (var tag = input.ReadTag(); tag != 0; tag = input.ReadTag())
        {
            switch (WireFormat.GetTagFieldNumber(tag))
            {
                case 1: text = input.ReadString(); break;
                case 2: score = input.ReadFloat(); break;
                case 3: type = input.ReadEnum(); break;
                default: input.SkipLastField(); break;
            }
        }

        return (text, score, type);
    }

    private static void WriteMessage(Stream output, int field, Action<CodedOutputStream> write)
    {
        using var body = new MemoryStream();
        var inner = new CodedOutputStream(body);
        write(inner);
        inner.Flush();
        var outer = new CodedOutputStream(output, leaveOpen: true);
        outer.WriteTag(field, WireFormat.WireType.LengthDelimited);
        outer.WriteBytes(ByteString.CopyFrom(body.ToArray()));
        outer.Flush();
    }
}
