namespace Plumbline.Application.Running;

/// <summary>
/// Standard output was closed by its reader (a pipe into a program that stopped reading). Not an error to
/// report: the sink that met it is dropped quietly and, since nobody reads the results, the run stops.
/// </summary>
public sealed class OutputClosedException(Exception? inner = null) : IOException(Reason, inner)
{
    public const string Reason = "standard output was closed";
}
