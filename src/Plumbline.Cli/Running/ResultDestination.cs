using System.Text;
using Plumbline.Core.Runs;
using Plumbline.Reports;

namespace Plumbline.Cli.Running;

/// <summary>Writes a finished result to a file, or to the command's output when no file was named.</summary>
internal static class ResultDestination
{
    public static async Task WriteReportAsync(IReportWriter writer, RunReport report, string? path, TextWriter output, CancellationToken cancellationToken)
    {
        if (path is not null)
        {
            await using var file = new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.Read);
            await writer.WriteAsync(report, file, cancellationToken);
            return;
        }

        // Through the output writer rather than the raw stream, so that tests and redirection see the same text.
        using var buffer = new MemoryStream();
        await writer.WriteAsync(report, buffer, cancellationToken);
        await output.WriteAsync(Encoding.UTF8.GetString(buffer.GetBuffer(), 0, (int)buffer.Length).AsMemory(), cancellationToken);
        await output.FlushAsync(cancellationToken);
    }

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
