using System.Buffers.Binary;
using System.Collections.Frozen;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Microsoft.Win32.SafeHandles;

namespace Plumbline.Models.Recording;

/// <summary>
/// Where each request of a recording file is, without its response: a compact key per distinct request mapped to
/// the position of its first line. Kept parsed, a recorded request costs about 2 KB of memory (180 MiB for the 80,000
/// of a 10,000-claim run); indexed, under 100 bytes, and a lookup reads its one line back from the file.
/// </summary>
/// <remarks>
/// The key is the first 128 bits of the request's SHA-256: two distinct requests of one file share it with a
/// probability near n²/2¹²⁹, nothing for any recording that fits on a disk, and a lookup compares the full key of
/// the line it reads back anyway. Both tables are frozen once built, so concurrent lookups need no locking.
/// </remarks>
internal sealed class RecordingIndex
{
    private readonly FrozenDictionary<UInt128, LinePosition> lines;
    private readonly FrozenDictionary<ulong, int> firstLineByTopic;

    private RecordingIndex(Dictionary<UInt128, LinePosition> lines, Dictionary<ulong, int> firstLineByTopic)
    {
        this.lines = lines.ToFrozenDictionary();
        this.firstLineByTopic = firstLineByTopic.ToFrozenDictionary();
    }

    /// <summary>Distinct requests in the recording.</summary>
    public int Count => lines.Count;

    /// <summary>Reads and validates every line of <paramref name="file"/> once, as <see cref="RecordingReader"/> does.</summary>
    /// <exception cref="RecordingFormatException">A line is malformed, or a request is recorded twice with different responses.</exception>
    public static async Task<RecordingIndex> BuildAsync(SafeFileHandle file, string path, string promptVersion, CancellationToken cancellationToken)
    {
        var lines = new Dictionary<UInt128, LinePosition>();
        var firstLineByTopic = new Dictionary<ulong, int>();
        await foreach (var (entry, position) in RecordingReader.ParseAllAsync(file, path, promptVersion, cancellationToken).ConfigureAwait(false))
        {
            var key = KeyOf(entry.Fingerprint.Key);
            if (lines.TryGetValue(key, out var earlier))
            {
                // Repeats are rare (a recording appended to twice), so the first line is read back rather than kept.
                var text = await RecordingFileLines.ReadAsync(file, earlier, cancellationToken).ConfigureAwait(false);
                RecordingReader.CheckRepeat(path, RecordingReader.ParseLine(path, earlier.Number, promptVersion, text), entry);
                continue;
            }

            lines.Add(key, position);
            firstLineByTopic.TryAdd(TopicKeyOf(entry.Topic), position.Number);
        }

        return new RecordingIndex(lines, firstLineByTopic);
    }

    /// <summary>Where the line recorded for the request with this <see cref="Core.Language.RequestFingerprint.Key"/> is.</summary>
    public bool TryFind(string fingerprintKey, out LinePosition position) => lines.TryGetValue(KeyOf(fingerprintKey), out position);

    /// <summary>The first line recorded for a topic (<see cref="RecordingReader.TopicOf"/>), if any.</summary>
    /// <remarks>Topics are kept as 64-bit hashes. A collision between a missing topic and a recorded one would only
    /// name a wrong line in the hint of a message about a request that already failed, and needs about 2³² topics in
    /// one file to become likely; that is not worth keeping the topic text of every line in memory.</remarks>
    public bool TryFindTopic(string topic, out int line) => firstLineByTopic.TryGetValue(TopicKeyOf(topic), out line);

    /// <summary>The first 32 hex digits (128 bits) of a fingerprint key.</summary>
    private static UInt128 KeyOf(string fingerprintKey) =>
        UInt128.Parse(fingerprintKey.AsSpan(0, 32), NumberStyles.AllowHexSpecifier, CultureInfo.InvariantCulture);

    private static ulong TopicKeyOf(string topic) => BinaryPrimitives.ReadUInt64BigEndian(SHA256.HashData(Encoding.UTF8.GetBytes(topic)));
}
