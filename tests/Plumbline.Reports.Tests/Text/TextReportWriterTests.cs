using Plumbline.Reports.Tests.Fixtures;
using Plumbline.Reports.Text;

namespace Plumbline.Reports.Tests.Text;

public sealed class TextReportWriterTests
{
    private static async Task<string[]> LinesAsync(bool colour = false) =>
        (await ReportOutput.TextAsync(new TextReportWriter(colour), SampleReports.Mixed())).Split('\n');

    [Fact]
    public async Task WriteAsync_SettledClaim_KeyLines()
    {
        var lines = await LinesAsync();

        var at = Array.IndexOf(lines, "c1  Water boils at 100 degrees Celsius at sea level.");
        Assert.True(at >= 0, string.Join('\n', lines));
        Assert.Equal("    answer true | direct answer true | gold true", lines[at + 1]);
        Assert.Equal("    status settled | margin 1.2346 (normalised 0.0) | two-sided", lines[at + 2]);
        Assert.Equal("    statements 3 kept, 1 pruned, 3 integral | falsified clauses 1", lines[at + 3]);
        Assert.Equal(
            "    contradiction (p 0.9877): #2 \"Water boils at 90 degrees Celsius at sea level.\" vs #0 \"Water boils at 100 degrees Celsius at sea level.\"",
            lines[at + 4]);
    }

    [Fact]
    public async Task WriteAsync_OverturnedClaim_AnswerAgainstDirectAnswer()
    {
        var lines = await LinesAsync();

        var at = Array.IndexOf(lines, "c2  Glass is a liquid.");
        Assert.True(at >= 0, string.Join('\n', lines));
        Assert.Equal("    answer false | direct answer true | gold false", lines[at + 1]);
        Assert.Equal("    status overturned | margin 0.5 (normalised 0.0)", lines[at + 2]);
    }

    [Fact]
    public async Task WriteAsync_EngineExtras_PairedAnswerNormalisedMarginStabilityAndConflict()
    {
        var lines = (await ReportOutput.TextAsync(new TextReportWriter(false), SampleReports.WithEngineExtras())).Split('\n');

        var at = Array.IndexOf(lines, "c1  Water boils at 100 degrees Celsius at sea level.");
        Assert.Equal("    answer true | direct answer true (paired false) | gold true", lines[at + 1]);
        // 1.23456 / 3.5 = 0.35273 -> 0.3527.
        Assert.Equal("    status settled | margin 1.2346 (normalised 0.3527) | stable in 2 of 3 trees | two-sided", lines[at + 2]);
        Assert.Equal("    statements 3 kept, 1 pruned, 3 integral | falsified clauses 1 | 2 cut-off explanations discarded", lines[at + 3]);
        Assert.Contains(lines, l => l.StartsWith("    conflict (dropped): entailment #2 \"Water boils at 90", StringComparison.Ordinal) && l.EndsWith("(p 0.6123), contradiction the other way (p 0.70)", StringComparison.Ordinal));
        Assert.Contains("    mean stability 66.7% of sampled trees give the majority answer | 0 ties", lines);
    }

    [Fact]
    public async Task WriteAsync_FailedClaim_ReasonShownWithoutMargin()
    {
        var lines = await LinesAsync();

        var at = Array.IndexOf(lines, "c3  The moon is made of cheese.");
        Assert.True(at >= 0, string.Join('\n', lines));
        Assert.Equal("    answer none | direct answer none | gold false", lines[at + 1]);
        Assert.Equal("    status failed", lines[at + 2]);
        Assert.Equal("    reason: " + SampleReports.FailureReason, lines[at + 3]);
    }

    [Fact]
    public async Task WriteAsync_LongStatement_QuotedShortened()
    {
        var lines = await LinesAsync();

        var line = Assert.Single(lines, l => l.Contains("#1 \"Glass is a liquid", StringComparison.Ordinal));
        var start = line.IndexOf("#1 \"", StringComparison.Ordinal) + 4;
        var quoted = line[start..line.IndexOf('"', start)];
        Assert.InRange(quoted.Length, TextReportWriter.QuoteLength - 5, TextReportWriter.QuoteLength);
        Assert.EndsWith("\u2026", quoted, StringComparison.Ordinal);
        Assert.StartsWith(quoted[..^1], SampleReports.LongStatement, StringComparison.Ordinal);
    }

    [Fact]
    public async Task WriteAsync_RunFigures_AccuraciesRatesAndCounts()
    {
        var lines = await LinesAsync();

        // Wilson 95% bounds for 1 of 2 (9.5%, 90.5%) and 2 of 2 (34.2%, 100%), worked by hand (common practice).
        Assert.Contains("    3 claims: 2 judged (1 settled, 1 overturned, 0 contested), 1 failed", lines);
        Assert.Contains("    direct accuracy   50.0% (1 of 2; Wilson 95% interval 9.5% to 90.5%)", lines);
        Assert.Contains("    coherent accuracy 100.0% (2 of 2; Wilson 95% interval 34.2% to 100.0%)", lines);
        Assert.Contains("    overturn rate 50.0% | contested rate 0.0% | two-sided rate 50.0% | mean margin 0.8673 (normalised 0.0)", lines);
        Assert.Contains("    links found 4 (1 entailment, 3 contradiction)", lines);
        Assert.Contains("    model calls 27 | tokens 2010 (1640 prompt, 370 completion) | wall time 4.5 s", lines);
    }

    [Fact]
    public async Task WriteAsync_NoGoldLabels_SaysSoInsteadOfAccuracy()
    {
        var text = await ReportOutput.TextAsync(new TextReportWriter(colour: false), SampleReports.WithoutGold());

        Assert.Contains("    accuracy: no judged claim carries a gold label\n", text, StringComparison.Ordinal);
        Assert.DoesNotContain("direct accuracy", text, StringComparison.Ordinal);
        Assert.Contains("wall time 350 ms", text, StringComparison.Ordinal);
    }

    [Fact]
    public async Task WriteAsync_Notice_LastLineOnce()
    {
        var lines = await LinesAsync();

        Assert.Single(lines, l => l.Contains(ReportNotice.Text, StringComparison.Ordinal));
        Assert.Equal("Notice: " + ReportNotice.Text, lines[^2]);
        Assert.Equal(string.Empty, lines[^1]);
    }

    [Fact]
    public async Task WriteAsync_WithoutColour_NoEscapeCodes()
    {
        var lines = await LinesAsync(colour: false);

        Assert.DoesNotContain(lines, l => l.Contains('\u001b', StringComparison.Ordinal));
    }

    [Fact]
    public async Task WriteAsync_WithColour_StatusesPainted()
    {
        var text = string.Join('\n', await LinesAsync(colour: true));

        Assert.Contains("status \u001b[32msettled\u001b[0m", text, StringComparison.Ordinal);
        Assert.Contains("status \u001b[33moverturned\u001b[0m", text, StringComparison.Ordinal);
        Assert.Contains("status \u001b[31mfailed\u001b[0m", text, StringComparison.Ordinal);
    }

    [Fact]
    public async Task WriteAsync_SameReportTwice_IdenticalBytes()
    {
        var report = SampleReports.Mixed();

        var first = await ReportOutput.BytesAsync(new TextReportWriter(colour: false), report);
        var second = await ReportOutput.BytesAsync(new TextReportWriter(colour: false), report);

        Assert.Equal(first, second);
        Assert.DoesNotContain((byte)'\r', first);
    }

    [Fact]
    public async Task WriteAsync_Stream_LeftOpen()
    {
        using var stream = new MemoryStream();

        await new TextReportWriter(colour: false).WriteAsync(SampleReports.Mixed(), stream, CancellationToken.None);

        Assert.True(stream.CanWrite);
    }

    [Theory]
    [InlineData("short", 10, "short")]
    [InlineData("exactly ten", 11, "exactly ten")]
    [InlineData("one two three four", 9, "one two\u2026")]
    public void Shorten_Text_CutWithEllipsis(string text, int length, string expected) =>
        Assert.Equal(expected, TextReportWriter.Shorten(text, length));
}
