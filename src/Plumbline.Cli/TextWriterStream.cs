using System.Text;

namespace Plumbline.Cli;

/// <summary>A write-only stream of UTF-8 bytes decoded onto a text writer, so report writers (which take streams)
/// can write to a test's string writer. Multi-byte characters split across writes are kept whole.</summary>
internal sealed class TextWriterStream(TextWriter writer) : Stream
{
    private readonly Decoder decoder = new UTF8Encoding(false).GetDecoder();

    public override bool CanRead => false;

    public override bool CanSeek => false;

    public override bool CanWrite => true;

    public override long Length => throw new NotSupportedException();

    public override long Position
    {
        get => throw new NotSupportedException();
        set => throw new NotSupportedException();
    }

    public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        var chars = new char[decoder.GetCharCount(buffer, flush: false)];
        var count = decoder.GetChars(buffer, chars, flush: false);
        writer.Write(chars, 0, count);
    }

    public override Task WriteAsync(byte[] buffer, int offset, int count, CancellationToken cancellationToken)
    {
        Write(buffer.AsSpan(offset, count));
        return Task.CompletedTask;
    }

    public override ValueTask WriteAsync(ReadOnlyMemory<byte> buffer, CancellationToken cancellationToken = default)
    {
        Write(buffer.Span);
        return ValueTask.CompletedTask;
    }

    public override void Flush() => writer.Flush();

    public override Task FlushAsync(CancellationToken cancellationToken) => writer.FlushAsync(cancellationToken);

    public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();
}
