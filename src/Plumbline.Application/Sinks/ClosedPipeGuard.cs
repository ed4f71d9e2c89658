using Plumbline.Application.Running;

namespace Plumbline.Application.Sinks;

/// <summary>
/// Passes writes through to standard output and turns "broken pipe" (the reader went away, as when the output is
/// piped into a program that has read enough) into an <see cref="OutputClosedException"/>, which ends the run
/// quietly instead of printing an error about an output nobody reads.
/// </summary>
internal sealed class ClosedPipeGuard(Stream inner) : Stream
{
    /// <summary>EPIPE on Linux and macOS.</summary>
    private const int BrokenPipe = 32;

    public override bool CanRead => false;

    public override bool CanSeek => false;

    public override bool CanWrite => true;

    public override long Length => throw new NotSupportedException();

    public override long Position
    {
        get => throw new NotSupportedException();
        set => throw new NotSupportedException();
    }

    public override void Write(byte[] buffer, int offset, int count) => Guard(() => inner.Write(buffer, offset, count));

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        try
        {
            inner.Write(buffer);
        }
        catch (IOException e) when (IsBrokenPipe(e))
        {
            throw new OutputClosedException(e);
        }
    }

    public override async ValueTask WriteAsync(ReadOnlyMemory<byte> buffer, CancellationToken cancellationToken = default)
    {
        try
        {
            await inner.WriteAsync(buffer, cancellationToken);
        }
        catch (IOException e) when (IsBrokenPipe(e))
        {
            throw new OutputClosedException(e);
        }
    }

    public override Task WriteAsync(byte[] buffer, int offset, int count, CancellationToken cancellationToken) =>
        WriteAsync(buffer.AsMemory(offset, count), cancellationToken).AsTask();

    public override void Flush() => Guard(inner.Flush);

    public override async Task FlushAsync(CancellationToken cancellationToken)
    {
        try
        {
            await inner.FlushAsync(cancellationToken);
        }
        catch (IOException e) when (IsBrokenPipe(e))
        {
            throw new OutputClosedException(e);
        }
    }

    public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();

    internal static bool IsBrokenPipe(IOException e) =>
        e is not OutputClosedException && (e.HResult == BrokenPipe || (e.HResult & 0xFFFF) == BrokenPipe
            || e.Message.Contains("Broken pipe", StringComparison.OrdinalIgnoreCase));

    private static void Guard(Action write)
    {
        try
        {
            write();
        }
        catch (IOException e) when (IsBrokenPipe(e))
        {
            throw new OutputClosedException(e);
        }
    }
}
