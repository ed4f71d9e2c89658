using System.Text;

namespace Plumbline.LocalModel;

/// <summary>
/// The input and output names of an ONNX graph, read straight from the file's protobuf encoding
/// (ModelProto.graph = field 7; GraphProto.input = 11, output = 12; ValueInfoProto.name = 1; see onnx.proto).
/// Everything else, weights included, is skipped by seeking, so a multi-gigabyte model is checked without
/// being loaded.
/// </summary>
internal sealed record OnnxSignature(IReadOnlyList<string> Inputs, IReadOnlyList<string> Outputs)
{
    private const int ModelGraph = 7;
    private const int GraphInput = 11;
    private const int GraphOutput = 12;
    private const int ValueInfoName = 1;

    /// <exception cref="InvalidDataException">The file is not an ONNX model.</exception>
    public static OnnxSignature Read(string path)
    {
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 4096);
        var reader = new Reader(stream);
        while (reader.Position < stream.Length)
        {
            var (field, wire) = reader.Tag();
            if (field == ModelGraph && wire == Reader.LengthDelimited)
            {
                var length = reader.Varint();
                return ReadGraph(reader, reader.Position + length);
            }

            reader.Skip(wire);
        }

        throw new InvalidDataException("no graph in the file");
    }

    private static OnnxSignature ReadGraph(Reader reader, long end)
    {
        var inputs = new List<string>();
        var outputs = new List<string>();
        while (reader.Position < end)
        {
            var (field, wire) = reader.Tag();
            if (wire == Reader.LengthDelimited && field is GraphInput or GraphOutput)
            {
                var length = reader.Varint();
                (field == GraphInput ? inputs : outputs).Add(ReadName(reader, reader.Position + length));
            }
            else
            {
                reader.Skip(wire);
            }
        }

        return new OnnxSignature(inputs, outputs);
    }

    private static string ReadName(Reader reader, long end)
    {
        var name = string.Empty;
        while (reader.Position < end)
        {
            var (field, wire) = reader.Tag();
            if (field == ValueInfoName && wire == Reader.LengthDelimited)
            {
                name = reader.Text();
            }
            else
            {
                reader.Skip(wire);
            }
        }

        return name;
    }

    /// <summary>Protobuf wire format: varints, tags and skipping (protobuf encoding guide).</summary>
    private sealed class Reader(Stream stream)
    {
        public const int LengthDelimited = 2;
        private const int VarintWire = 0;
        private const int Fixed64 = 1;
        private const int Fixed32 = 5;

        public long Position => stream.Position;

        public (int Field, int Wire) Tag()
        {
            var tag = Varint();
            return ((int)(tag >> 3), (int)(tag & 7));
        }

        public long Varint()
        {
            long value = 0;
            for (var shift = 0; shift < 64; shift += 7)
            {
                var b = stream.ReadByte();
                if (b < 0)
                {
                    throw new InvalidDataException("the file ends inside a number");
                }

                value |= (long)(b & 0x7f) << shift;
                if ((b & 0x80) == 0)
                {
                    return value;
                }
            }

            throw new InvalidDataException("a number longer than ten bytes");
        }

        public string Text()
        {
            var length = Varint();
            if (length < 0 || length > 1 << 20 || stream.Position + length > stream.Length)
            {
                throw new InvalidDataException("a name of impossible length");
            }

            var bytes = new byte[length];
            stream.ReadExactly(bytes);
            return Encoding.UTF8.GetString(bytes);
        }

        public void Skip(int wire)
        {
            long skip = wire switch
            {
                VarintWire => 0,
                Fixed64 => 8,
                LengthDelimited => Varint(),
                Fixed32 => 4,
                _ => throw new InvalidDataException($"wire type {wire} does not occur in ONNX files"),
            };
            if (wire == VarintWire)
            {
                Varint();
                return;
            }

            if (skip < 0 || stream.Position + skip > stream.Length)
            {
                throw new InvalidDataException("a field runs past the end of the file");
            }

            stream.Seek(skip, SeekOrigin.Current);
        }
    }
}
