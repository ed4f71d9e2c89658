using Plumbline.Reports.Model;
using Plumbline.Reports.Tests.Fixtures;

namespace Plumbline.Reports.Tests;

public sealed class ReportWriterRegistryTests
{
    private sealed class FixedWriter(string format) : IReportWriter
    {
        public string Format => format;

        public Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken) =>
            output.WriteAsync(new byte[] { 42 }, cancellationToken).AsTask();
    }

    public static TheoryData<string> DefaultFormats => [.. ReportWriterRegistry.Default.Formats];

    [Fact]
    public void Default_Formats_EveryShippedFormat() =>
        Assert.Equal(["html", "json", "jsonl", "junit", "md", "text"], ReportWriterRegistry.Default.Formats);

    [Theory]
    [MemberData(nameof(DefaultFormats))]
    public void Create_KnownFormat_WriterNamesIt(string format) =>
        Assert.Equal(format, ReportWriterRegistry.Default.Create(format).Format);

    /// <summary>Every format, present and future, must state the notice exactly once.</summary>
    [Theory]
    [MemberData(nameof(DefaultFormats))]
    public async Task WriteAsync_AnyFormat_StatesNoticeOnce(string format)
    {
        var text = await ReportOutput.TextAsync(ReportWriterRegistry.Default.Create(format), SampleReports.Mixed());

        var at = text.IndexOf(ReportNotice.Text, StringComparison.Ordinal);
        Assert.True(at >= 0, $"{format} report lacks the notice");
        Assert.Equal(-1, text.IndexOf(ReportNotice.Text, at + 1, StringComparison.Ordinal));
    }

    [Fact]
    public void Create_NameInOtherCase_Found() =>
        Assert.Equal("json", ReportWriterRegistry.Default.Create(" JSON ").Format);

    [Fact]
    public void Create_UnknownFormat_ThrowsListingKnownOnes()
    {
        var error = Assert.Throws<ArgumentException>(() => ReportWriterRegistry.Default.Create("yaml"));

        Assert.Contains("'yaml'", error.Message, StringComparison.Ordinal);
        Assert.Contains("html, json, jsonl, junit, md, text", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void TryCreate_UnknownFormat_False()
    {
        Assert.False(ReportWriterRegistry.Default.TryCreate("csv", ReportOptions.Default, out var writer));
        Assert.Null(writer);
    }

    [Fact]
    public async Task Create_TextWithColour_PassesFlagToWriter()
    {
        var text = await ReportOutput.TextAsync(ReportWriterRegistry.Default.Create("text", new ReportOptions(Colour: true)), SampleReports.Mixed());

        Assert.Contains("\u001b[", text, StringComparison.Ordinal);
    }

    [Fact]
    public void With_NewFormat_AddedWithoutChangingOriginal()
    {
        var extended = ReportWriterRegistry.Default.With("Fixed", _ => new FixedWriter("fixed"));

        Assert.Equal(["fixed", "html", "json", "jsonl", "junit", "md", "text"], extended.Formats);
        Assert.Equal("fixed", extended.Create("fixed").Format);
        Assert.Equal(["html", "json", "jsonl", "junit", "md", "text"], ReportWriterRegistry.Default.Formats);
    }

    [Fact]
    public void With_KnownFormat_Replaced()
    {
        var replaced = ReportWriterRegistry.Default.With("json", _ => new FixedWriter("json-double"));

        Assert.Equal(["html", "json", "jsonl", "junit", "md", "text"], replaced.Formats);
        Assert.Equal("json-double", replaced.Create("json").Format);
    }
}
