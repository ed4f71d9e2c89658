namespace Plumbline.Application.Sinks;

/// <summary>Where a report goes: a file (created when the report is written) or standard output (left open).</summary>
public sealed class ReportDestination
{
    private readonly Func<Stream> open;

    private ReportDestination(string description, Func<Stream> open, bool ownsStream)
    {
        Description = description;
        this.open = open;
        OwnsStream = ownsStream;
    }

    /// <summary>"standard output" or the file's path, for messages.</summary>
    public string Description { get; }

    /// <summary>True for a file, which the sink closes when done.</summary>
    public bool OwnsStream { get; }

    public static ReportDestination File(string path) => new(
        path,
        () => new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.Read, 1 << 16),
        ownsStream: true);

    /// <summary>Standard output; a write to it after its reader went away becomes an <see cref="Running.OutputClosedException"/>.</summary>
    public static ReportDestination StandardOutput(Func<Stream> open) =>
        new("standard output", () => new ClosedPipeGuard(open()), ownsStream: false);

    public Stream Open() => open();
}
