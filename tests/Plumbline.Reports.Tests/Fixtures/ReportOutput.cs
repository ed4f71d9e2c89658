using System.Text;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Tests.Fixtures;

/// <summary>Runs a writer into memory, as the command line would into a file or the terminal.</summary>
public static class ReportOutput
{
    public static async Task<byte[]> BytesAsync(IReportWriter writer, RunReport report)
    {
        using var stream = new MemoryStream();
        await writer.WriteAsync(report, stream, CancellationToken.None);
        return stream.ToArray();
    }

    public static async Task<string> TextAsync(IReportWriter writer, RunReport report) =>
        new UTF8Encoding(false, throwOnInvalidBytes: true).GetString(await BytesAsync(writer, report));
}
