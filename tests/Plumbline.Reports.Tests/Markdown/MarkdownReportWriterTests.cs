using Plumbline.Core.Coherence;
using Plumbline.Reports.Markdown;
using Plumbline.Reports.Tests.Fixtures;

namespace Plumbline.Reports.Tests.Markdown;

public sealed class MarkdownReportWriterTests
{
    private static async Task<string[]> LinesAsync(Plumbline.Reports.Model.RunReport? report = null) =>
        (await ReportOutput.TextAsync(new MarkdownReportWriter(), report ?? SampleReports.Mixed())).Split('\n');

    [Fact]
    public async Task WriteAsync_FiguresTable_HeaderAndRowsWorkedByHand()
    {
        var lines = await LinesAsync();

        var at = Array.IndexOf(lines, "| figure | value |");
        Assert.True(at >= 0, string.Join('\n', lines));
        Assert.Equal("|---|---|", lines[at + 1]);
        Assert.Contains("| claims | 3 (1 settled, 1 overturned, 0 contested, 1 failed) |", lines);
        // Wilson 95% bounds for 1 of 2, worked by hand (common practice).
        Assert.Contains("| direct accuracy | 50.0% (1 of 2; Wilson 95% interval 9.5% to 90.5%) |", lines);
        Assert.Contains("| mean margin | 0.8673 (normalised 0.2168) |", lines);
        Assert.Contains("| mean stability | 66.7% (0 tied) |", lines);
    }

    [Fact]
    public async Task WriteAsync_OverturnedAndFailed_ListedSettledLeftOut()
    {
        var lines = await LinesAsync();

        Assert.Contains("### Overturned (1)", lines);
        Assert.Contains("| c2 | Glass is a liquid. | true | **false** | false | 0.5 (0.125) |  |  |", lines);
        Assert.Contains("### Failed (1)", lines);
        Assert.Contains($"| c3 | The moon is made of cheese. | {SampleReports.FailureReason} |", lines);
        Assert.DoesNotContain("### Contested (0)", lines);
        Assert.DoesNotContain(lines, l => l.StartsWith("| c1 ", StringComparison.Ordinal));
    }

    [Fact]
    public async Task WriteAsync_ManyOverturned_CappedWithACountOfTheRest()
    {
        var many = Enumerable.Range(1, MarkdownReportWriter.RowsPerSection + 5)
            .Select(i => SampleReports.Overturned with { Claim = SampleReports.Overturned.Claim with { Id = $"o{i}" } })
            .ToList();

        var lines = await LinesAsync(SampleReports.Report(many, SampleReports.Started.AddSeconds(1)));

        Assert.Contains($"### Overturned ({MarkdownReportWriter.RowsPerSection + 5})", lines);
        Assert.Equal(MarkdownReportWriter.RowsPerSection, lines.Count(l => System.Text.RegularExpressions.Regex.IsMatch(l, @"^\| o[0-9]+ \|")));
        Assert.Contains("\u2026 and 5 more (see the full report).", lines);
    }

    [Fact]
    public async Task WriteAsync_PipeInClaimText_Escaped()
    {
        var piped = SampleReports.Overturned with { Claim = SampleReports.Overturned.Claim with { Text = "Either a | b." } };

        var lines = await LinesAsync(SampleReports.Report([piped], SampleReports.Started.AddSeconds(1)));

        Assert.Contains(lines, l => l.Contains("| Either a \\| b. |", StringComparison.Ordinal));
        Assert.Equal(ClaimStatus.Overturned, piped.Status);
    }
}
