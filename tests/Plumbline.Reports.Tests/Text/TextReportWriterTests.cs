using Plumbline.Core.Runs;
using Plumbline.Reports.Model;
using Plumbline.Reports.Tests.Fixtures;
using Plumbline.Reports.Text;

namespace Plumbline.Reports.Tests.Text;

public sealed class TextReportWriterTests
{
    private static async Task<string[]> LinesAsync(bool colour = false, RunReport? report = null) =>
        (await ReportOutput.TextAsync(new TextReportWriter(colour), report ?? SampleReports.Mixed())).Split('\n');

    private static int At(string[] lines, string line)
    {
        var at = Array.IndexOf(lines, line);
        Assert.True(at >= 0, $"no line \"{line}\" in:\n{string.Join('\n', lines)}");
        return at;
    }

    /// <summary>
    /// Beliefs by hand from the fixture's probabilities: #0 0.91 / (0.91 + 0.07) = 0.93, #1 0.95 / 0.98 = 0.97,
    /// #2 0.12 / 0.92 = 0.13, #3 0.6 / 1.15 = 0.52. Values from the fixture's optimum; #3 is pruned.
    /// </summary>
    [Fact]
    public async Task WriteAsync_SettledClaim_AnswerLineThenTreeOutlineThenWhatDecided()
    {
        var lines = await LinesAsync();

        var at = At(lines, "c1  Water boils at 100 degrees Celsius at sea level.");
        Assert.Equal(
            [
                "  answer true | direct answer true | gold true | settled | margin 1.2346 (normalised 0.3086) | 2 of 3 trees agree | two-sided",
                "  tree: 3 kept, 1 pruned, 3 integral, 1 cut off (value in the optimum T/F, - pruned; b = belief)",
                "    #0 T b0.93 Water boils at 100 degrees Celsius at sea level.",
                "    \u251c\u2500 #1 T b0.97 [for true] At sea level the air pressure is one atmosphere.",
                "    \u251c\u2500 #2 F b0.13 [for false] Water boils at 90 degrees Celsius at sea level.",
                "    \u2514\u2500 #3 - b0.52 [for false] Boiling points never depend on pressure.",
                "  decided by",
                "    #1 entails #0 (weight 1.0, p 0.9123)",
                "  contradictions",
                "    #0 -> #2: contradiction 0.91; #2 -> #0: contradiction 0.9877",
            ],
            lines[(at + 1)..(at + 11)]);
    }

    [Fact]
    public async Task WriteAsync_OverturnedClaim_AnswerAgainstDirectAnswer()
    {
        var lines = await LinesAsync();

        var at = At(lines, "c2  Glass is a liquid.");
        Assert.Equal("  answer false | direct answer true (paired false) | gold false | overturned | margin 0.5 (normalised 0.125)", lines[at + 1]);
        var conflicts = At(lines, "  conflicting readings");
        Assert.Equal("    #0 -> #1 entailment 0.61 against #1 -> #0 contradiction 0.57 (both dropped)", lines[conflicts + 1]);
        // Both contradictions of the claim, each pair once with both directions: {0,2} and {1,2}.
        Assert.Contains("    #0 -> #2: contradiction 0.85; #2 -> #0: contradiction 0.95", lines);
        Assert.Contains("    #1 -> #2: contradiction 0.93; #2 -> #1: neutral 0.50", lines);
    }

    [Fact]
    public async Task WriteAsync_FailedClaim_ReasonShownWithoutMarginOrTree()
    {
        var lines = await LinesAsync();

        var at = At(lines, "c3  The moon is made of cheese.");
        Assert.Equal("  answer none | direct answer none | gold false | failed", lines[at + 1]);
        Assert.Equal("  reason: " + SampleReports.FailureReason, lines[at + 2]);
    }

    [Fact]
    public async Task WriteAsync_LongStatement_ShortenedInTheOutline()
    {
        var lines = await LinesAsync();

        var line = Assert.Single(lines, l => l.Contains("#1 F b0.30 [for true] Glass is a liquid", StringComparison.Ordinal));
        var text = line[line.IndexOf("Glass", StringComparison.Ordinal)..];
        Assert.Equal(TextReportWriter.StatementLength, text.Length);
        Assert.EndsWith("\u2026", text, StringComparison.Ordinal);
    }

    [Fact]
    public async Task WriteAsync_Verbose_EveryPairListed()
    {
        var lines = await LinesAsync(report: SampleReports.Report([SampleReports.Settled], SampleReports.Started.AddSeconds(1), PairListing.All));

        var at = At(lines, "  pairs");
        Assert.Equal(
            [
                "    #0 -> #1: neutral 0.70; #1 -> #0: entailment 0.9123",
                "    #0 -> #2: contradiction 0.91; #2 -> #0: contradiction 0.9877",
                "    #1 -> #2: neutral 0.80; #2 -> #1: neutral 0.70",
            ],
            lines[(at + 1)..(at + 4)]);
    }

    [Fact]
    public async Task WriteAsync_RunFigures_AccuraciesRatesAndCounts()
    {
        var lines = await LinesAsync();

        // Wilson 95% bounds for 1 of 2 (9.5%, 90.5%) and 2 of 2 (34.2%, 100%), worked by hand (common practice).
        Assert.Contains("    3 claims: 2 judged (1 settled, 1 overturned, 0 contested), 1 failed", lines);
        Assert.Contains("    direct accuracy   50.0% (1 of 2; Wilson 95% interval 9.5% to 90.5%)", lines);
        Assert.Contains("    coherent accuracy 100.0% (2 of 2; Wilson 95% interval 34.2% to 100.0%)", lines);
        Assert.Contains("    paired direct accuracy 100.0% (2 of 2; Wilson 95% interval 34.2% to 100.0%)", lines);
        // Mean normalised margin (0.30864 + 0.125) / 2; stability measured on the settled claim only, 2 of 3.
        Assert.Contains("    overturn rate 50.0% | contested rate 0.0% | two-sided rate 50.0% | mean margin 0.8673 (normalised 0.2168)", lines);
        Assert.Contains("    mean stability 66.7% of sampled trees give the majority answer | 0 tied", lines);
        Assert.Contains("    links found 4 (1 entailment, 3 contradiction) | conflicting pairs 1 | cut-off explanations 1", lines);
        Assert.Contains("    model calls 27 | tokens 2010 (1640 prompt, 370 completion) | wall time 4.5 s", lines);
        Assert.Contains("    beliefs estimated by sampling for 1 claim", lines);
    }

    [Fact]
    public async Task WriteAsync_GatesAndStop_Shown()
    {
        var report = SampleReports.Report(
            [SampleReports.Settled],
            SampleReports.Started.AddSeconds(1),
            completion: new RunCompletion("budget of 100 calls spent", ["c7"], []),
            gates: [new GateResult("overturn_rate", 0.25, "<=", 0.2, false)]);

        var lines = await LinesAsync(report: report);

        Assert.Contains("    FAIL  overturn_rate = 0.25 (wanted <= 0.2)", lines);
        Assert.Contains("Stopped: budget of 100 calls spent", lines);
        Assert.Contains("    not judged (1): c7", lines);
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
        Assert.Equal("Note: " + ReportNotice.Text, lines[^2]);
        Assert.Equal(string.Empty, lines[^1]);
    }

    [Fact]
    public async Task WriteAsync_WithoutColour_NoEscapeCodes()
    {
        var lines = await LinesAsync(colour: false);

        Assert.DoesNotContain(lines, l => l.Contains('\u001b', StringComparison.Ordinal));
    }

    [Fact]
    public async Task WriteAsync_WithColour_StatusesAndValuesPainted()
    {
        var text = string.Join('\n', await LinesAsync(colour: true));

        Assert.Contains("| \u001b[32msettled\u001b[0m", text, StringComparison.Ordinal);
        Assert.Contains("| \u001b[33moverturned\u001b[0m", text, StringComparison.Ordinal);
        Assert.Contains("| \u001b[31mfailed\u001b[0m", text, StringComparison.Ordinal);
        Assert.Contains("#0 \u001b[36mT\u001b[0m b0.93", text, StringComparison.Ordinal);
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
        Assert.Equal(expected, ReportText.Shorten(text, length));
}
