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
}
