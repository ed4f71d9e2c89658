using System.Text;

namespace Plumbline.Cli.Running;

/// <summary>Writes a small finished result (solve, nli) to a file, or to the command's output when no file was named.</summary>
internal static class ResultDestination
{
    public static async Task WriteTextAsync(string? path, TextWriter output, string text, CancellationToken cancellationToken)
    {
        if (path is not null)
        {
            await File.WriteAllTextAsync(path, text, new UTF8Encoding(false), cancellationToken);
            return;
        }

        await output.WriteAsync(text.AsMemory(), cancellationToken);
        await output.FlushAsync(cancellationToken);
    }

    /// <summary>Writes a rendered document (a merged report, a comparison) to a file, or to standard output as bytes.</summary>
    public static async Task WriteAsync(string? path, Func<Stream> standardOutput, Func<Stream, Task> write)
    {
        await using var stream = path is null
            ? standardOutput()
            : new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.Read);
        await write(stream);
    }
}
