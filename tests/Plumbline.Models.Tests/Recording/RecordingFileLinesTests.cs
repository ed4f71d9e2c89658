using System.Text;
using Plumbline.Models.Recording;
using Xunit;

namespace Plumbline.Models.Tests.Recording;

/// <summary>The byte positions of lines must read back exactly the text a StreamReader (what recordings were always read
/// with) gives for the same line, whatever the byte order mark, line ends and characters.</summary>
public sealed class RecordingFileLinesTests : IDisposable
{
    private static readonly byte[] Bom = [0xEF, 0xBB, 0xBF];

    private readonly TempDirectory temp = new();

    public void Dispose() => temp.Dispose();

    [Fact]
    public async Task ReadAllAsync_BomCrLfLoneCrBlankAndMultiByteLines_SameLinesAsStreamReaderAndEachReadsBack()
    {
        var text = "first line\r\n\r\nBärin — 熊 🐻 naïve\r   \rlone CR above\n\n\r\nlast, no line end ß";
        var path = WriteBytes("lines.txt", [.. Bom, .. Encoding.UTF8.GetBytes(text)]);

        await AssertSameAsStreamReaderAsync(path);
    }

    [Fact]
    public async Task ReadAllAsync_LineEndsAtChunkBoundaryAndLinesLongerThanAChunk_SameLinesAsStreamReader()
    {
        // The first read takes 64 KiB: one file puts "\r\n" across that boundary, the other a "\r" alone as its
        // last byte; the first also has lines several chunks long, with multi-byte characters cut by later reads.
        var crLf = new StringBuilder()
            .Append('a', 65_535).Append("\r\n")
            .Append(string.Concat(Enumerable.Repeat("ä熊", 40_000))).Append('\n')
            .Append('b', 1_000).Append("\rafter a lone CR\r\n")
            .Append('c', 200_000).Append("\r\n")
            .Append("end")
            .ToString();
        var loneCr = new string('x', 65_535) + "\ry\n";

        Assert.Equal(6, await AssertSameAsStreamReaderAsync(WriteBytes("crlf.txt", Encoding.UTF8.GetBytes(crLf))));
        Assert.Equal(2, await AssertSameAsStreamReaderAsync(WriteBytes("cr.txt", Encoding.UTF8.GetBytes(loneCr))));
    }

    [Fact]
    public async Task ReadAllAsync_EmptyFileAndBomOnly_NoLines()
    {
        var empty = WriteBytes("empty.txt", []);
        var bomOnly = WriteBytes("bom.txt", Bom);

        Assert.Equal(0, await AssertSameAsStreamReaderAsync(empty));
        Assert.Equal(0, await AssertSameAsStreamReaderAsync(bomOnly));
    }

    [Fact]
    public async Task ReadAllAsync_Utf16File_RefusedAtLineOne()
    {
        var path = WriteBytes("utf16.jsonl", [.. Encoding.Unicode.GetPreamble(), .. Encoding.Unicode.GetBytes("{}\n")]);
        using var file = await RecordingFileLines.OpenAsync(path, CancellationToken.None);

        var error = await Assert.ThrowsAsync<RecordingFormatException>(async () =>
        {
            await foreach (var _ in RecordingFileLines.ReadAllAsync(file, path, CancellationToken.None))
            {
            }
        });

        Assert.Equal($"{path}:1: the file is UTF-16 or UTF-32; a recording is UTF-8 (save it as UTF-8)", error.Message);
    }

    /// <summary>Checks the lines against StreamReader's and that each position reads its text back; returns the count.</summary>
    private static async Task<int> AssertSameAsStreamReaderAsync(string path)
    {
        var expected = new List<string>();
        using (var reader = new StreamReader(path, Encoding.UTF8, detectEncodingFromByteOrderMarks: true))
        {
            while (await reader.ReadLineAsync() is { } line)
            {
                expected.Add(line);
            }
        }

        using var file = await RecordingFileLines.OpenAsync(path, CancellationToken.None);
        var lines = new List<(LinePosition Position, string Text)>();
        await foreach (var line in RecordingFileLines.ReadAllAsync(file, path, CancellationToken.None))
        {
            lines.Add(line);
        }

        Assert.Equal(expected, lines.Select(l => l.Text));
        Assert.Equal(Enumerable.Range(1, expected.Count), lines.Select(l => l.Position.Number));
        foreach (var (position, text) in lines)
        {
            Assert.Equal(text, await RecordingFileLines.ReadAsync(file, position, CancellationToken.None));
        }

        return lines.Count;
    }

    private string WriteBytes(string name, byte[] bytes)
    {
        var path = temp.File(name);
        File.WriteAllBytes(path, bytes);
        return path;
    }
}
