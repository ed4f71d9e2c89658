using System.Buffers.Binary;
using System.Security.Cryptography;
using System.Text;
using Plumbline.Core.Claims;

namespace Plumbline.Application.Input;

/// <summary>
/// SHA-256 over the usable claims of an input, in order: for each claim its id, text, gold label and tags, each
/// string as a 4-byte little-endian length and its UTF-8 bytes, the gold label as one byte (0 false, 1 true,
/// 2 none). A fixed binary layout rather than JSON, so no escaping rule of any serialiser can change it: two runs
/// that read the same claims carry the same digest, whatever the file's name, format or line endings.
/// </summary>
internal sealed class ClaimDigest : IDisposable
{
    public const string Prefix = "sha256:";

    private readonly IncrementalHash hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);

    public void Add(Claim claim)
    {
        String(claim.Id);
        String(claim.Text);
        hash.AppendData([claim.Gold switch { false => (byte)0, true => (byte)1, null => (byte)2 }]);
        Int(claim.Tags.Count);
        foreach (var tag in claim.Tags)
        {
            String(tag);
        }
    }

    /// <summary>"sha256:" and the lower-case hex digest.</summary>
    public string Finish() => Prefix + Convert.ToHexStringLower(hash.GetHashAndReset());

    public void Dispose() => hash.Dispose();

    private void String(string text)
    {
        var bytes = Encoding.UTF8.GetBytes(text);
        Int(bytes.Length);
        hash.AppendData(bytes);
    }

    private void Int(int value)
    {
        Span<byte> bytes = stackalloc byte[4];
        BinaryPrimitives.WriteInt32LittleEndian(bytes, value);
        hash.AppendData(bytes);
    }
}
