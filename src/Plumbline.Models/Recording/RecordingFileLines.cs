using System.Buffers;
using System.Runtime.CompilerServices;
using System.Text;
using Microsoft.Win32.SafeHandles;

namespace Plumbline.Models.Recording;

/// <summary>
/// The lines of a recording file with their byte positions, so that a line can be read back later by position
/// alone. Lines end as <see cref="StreamReader.ReadLine()"/> ends them ("\n", "\r" or "\r\n"), so line numbers
/// match what a text editor shows; a UTF-8 byte order mark is skipped. Neither line-end byte can occur inside a
/// multi-byte UTF-8 character, so splitting bytes first and decoding each line after gives the same text as
/// decoding the whole file.
/// </summary>
internal static class RecordingFileLines
{
    private const int ChunkSize = 64 * 1024;
    private static readonly byte[] Utf8Bom = [0xEF, 0xBB, 0xBF];

    /// <summary>Opens a recording to be read by position. A pipe (a shell's <c>&lt;(zcat recording.jsonl.gz)</c>) can be
    /// read only once and not by position, so it is first copied to a temporary file, deleted when the handle closes.</summary>
    public static async Task<SafeFileHandle> OpenAsync(string path, CancellationToken cancellationToken)
    {
        // Delete sharing lets the file be removed (or a test folder cleaned up) while a recording is open.
        var file = File.OpenHandle(path, FileMode.Open, FileAccess.Read, FileShare.Read | FileShare.Delete);
        try
        {
            _ = RandomAccess.GetLength(file); // throws for a file that cannot be read by position
            return file;
        }
        catch (NotSupportedException)
        {
            using (file)
            {
                return await CopyAsync(file, cancellationToken).ConfigureAwait(false);
            }
        }
    }

    /// <summary>Every line of the file, blank ones included, in order.</summary>
    /// <exception cref="RecordingFormatException">The file starts with a UTF-16 or UTF-32 byte order mark.</exception>
    public static async IAsyncEnumerable<(LinePosition Position, string Text)> ReadAllAsync(
        SafeFileHandle file, string path, [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        var buffer = ArrayPool<byte>.Shared.Rent(ChunkSize);
        try
        {
            var bufferOffset = 0L; // file offset of buffer[0]
            var end = await FillAsync(file, buffer, 0, 0, cancellationToken).ConfigureAwait(false);
            var endOfFile = end < buffer.Length;
            var start = SkipByteOrderMark(buffer.AsSpan(0, end), path); // first byte of the current line in buffer
            var number = 0;
            var searchFrom = start;
            while (true)
            {
                var found = buffer.AsSpan(searchFrom, end - searchFrom).IndexOfAny((byte)'\n', (byte)'\r');
                var lineEnd = found < 0 ? -1 : searchFrom + found;

                // A "\r" as the last byte read may be the first half of "\r\n": read on before deciding.
                if (lineEnd >= 0 && (buffer[lineEnd] == '\n' || lineEnd + 1 < end || endOfFile))
                {
                    number++;
                    yield return Line(buffer, bufferOffset, start, lineEnd - start, number);
                    start = lineEnd + (buffer[lineEnd] == '\r' && lineEnd + 1 < end && buffer[lineEnd + 1] == '\n' ? 2 : 1);
                    searchFrom = start;
                    continue;
                }

                if (endOfFile)
                {
                    // A last line without a line end is still a line; an empty rest after the last line end is not.
                    if (start < end)
                    {
                        yield return Line(buffer, bufferOffset, start, end - start, number + 1);
                    }

                    yield break;
                }

                // Keep the unfinished line, grow the buffer when that line fills it, and read on.
                var kept = end - start;
                searchFrom = lineEnd >= 0 ? lineEnd - start : kept;
                var target = kept == buffer.Length ? ArrayPool<byte>.Shared.Rent(buffer.Length * 2) : buffer;
                Buffer.BlockCopy(buffer, start, target, 0, kept);
                if (target != buffer)
                {
                    ArrayPool<byte>.Shared.Return(buffer);
                    buffer = target;
                }

                bufferOffset += start;
                start = 0;
                end = await FillAsync(file, buffer, kept, bufferOffset + kept, cancellationToken).ConfigureAwait(false);
                endOfFile = end < buffer.Length;
            }
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(buffer);
        }
    }

    /// <summary>Reads back the text of one line found by <see cref="ReadAllAsync"/>.</summary>
    /// <exception cref="EndOfStreamException">The file is now shorter than it was when the line was found.</exception>
    public static async Task<string> ReadAsync(SafeFileHandle file, LinePosition position, CancellationToken cancellationToken)
    {
        var buffer = ArrayPool<byte>.Shared.Rent(Math.Max(position.Length, 1));
        try
        {
            // RandomAccess reads at an offset without moving a shared file position, so concurrent calls need no lock.
            var read = 0;
            while (read < position.Length)
            {
                var n = await RandomAccess.ReadAsync(file, buffer.AsMemory(read, position.Length - read), position.Offset + read, cancellationToken)
                    .ConfigureAwait(false);
                if (n == 0)
                {
                    throw new EndOfStreamException($"line {position.Number} ends past the end of the file");
                }

                read += n;
            }

            return Encoding.UTF8.GetString(buffer, 0, position.Length);
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(buffer);
        }
    }

    private static async Task<SafeFileHandle> CopyAsync(SafeFileHandle pipe, CancellationToken cancellationToken)
    {
        var copy = File.OpenHandle(
            Path.Combine(Path.GetTempPath(), $"plumb-recording-{Guid.NewGuid():N}.jsonl"),
            FileMode.CreateNew, FileAccess.ReadWrite, FileShare.None, FileOptions.DeleteOnClose);
        try
        {
            await using var source = new FileStream(pipe, FileAccess.Read, bufferSize: 0);
            var buffer = new byte[ChunkSize];
            var offset = 0L;
            int read;
            while ((read = await source.ReadAsync(buffer, cancellationToken).ConfigureAwait(false)) > 0)
            {
                await RandomAccess.WriteAsync(copy, buffer.AsMemory(0, read), offset, cancellationToken).ConfigureAwait(false);
                offset += read;
            }

            return copy;
        }
        catch
        {
            copy.Dispose();
            throw;
        }
    }

    private static (LinePosition Position, string Text) Line(byte[] buffer, long bufferOffset, int start, int length, int number) =>
        (new LinePosition(bufferOffset + start, length, number), Encoding.UTF8.GetString(buffer, start, length));

    /// <summary>Fills <paramref name="buffer"/> from <paramref name="from"/> on; returns where the bytes end, short of the
    /// buffer's length only at the end of the file.</summary>
    private static async Task<int> FillAsync(SafeFileHandle file, byte[] buffer, int from, long fileOffset, CancellationToken cancellationToken)
    {
        var end = from;
        while (end < buffer.Length)
        {
            var n = await RandomAccess.ReadAsync(file, buffer.AsMemory(end), fileOffset + (end - from), cancellationToken).ConfigureAwait(false);
            if (n == 0)
            {
                break;
            }

            end += n;
        }

        return end;
    }

    /// <summary>How many bytes of byte order mark the file starts with. A StreamReader would also decode UTF-16 and
    /// UTF-32; the format is UTF-8 and lines are split as UTF-8 bytes, so those are refused with a message instead of
    /// being misread.</summary>
    private static int SkipByteOrderMark(ReadOnlySpan<byte> head, string path)
    {
        if (head.StartsWith(Utf8Bom))
        {
            return Utf8Bom.Length;
        }

        if (head.StartsWith((ReadOnlySpan<byte>)[0xFF, 0xFE]) || head.StartsWith((ReadOnlySpan<byte>)[0xFE, 0xFF])
            || head.StartsWith((ReadOnlySpan<byte>)[0x00, 0x00, 0xFE, 0xFF]))
        {
            throw new RecordingFormatException(path, 1, null, "the file is UTF-16 or UTF-32; a recording is UTF-8 (save it as UTF-8)");
        }

        return 0;
    }
}
