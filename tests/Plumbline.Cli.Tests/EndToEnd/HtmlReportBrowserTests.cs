namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>
/// The sample run's HTML report in a real headless Chromium: no console errors, one SVG tree per claim, the status and
/// text filters hide and show the right rows, and a screenshot is kept in artifacts/ for the CI run to keep.
/// Counts by status come from the hand-checked verdict table (<see cref="SampleSweepTests.ExpectedVerdicts"/>).
/// </summary>
public sealed class HtmlReportBrowserTests(SampleSweep sweep) : IClassFixture<SampleSweep>
{
    /// <summary>Where the screenshot goes: a folder CI keeps as an artefact.</summary>
    public static string ScreenshotPath => Path.Combine(SampleSweep.RepositoryRoot, "artifacts", "html-report.png");

    private static int Claims => SampleSweepTests.ExpectedVerdicts.Count;

    private static int WithStatus(string status) => SampleSweepTests.ExpectedVerdicts.Count(r => (string)r[3] == status);

    private const string VisibleRows = "Array.from(document.querySelectorAll('tr[data-claim]')).filter(r => !r.hidden && r.offsetParent !== null).map(r => r.querySelector('a').textContent)";

    [Fact]
    public async Task Browser_SampleReport_RendersTreesFiltersAndLogsNoError()
    {
        Assert.True(sweep.Result.ExitCode == 0, sweep.Result.ToString());
        await using var browser = await HeadlessBrowser.StartAsync();

        await browser.OpenAsync(sweep.FileOf("html"));

        Assert.Equal(Claims, (int)(await browser.EvaluateAsync("document.querySelectorAll('svg.tree').length"))!);
        Assert.Equal(Claims, (int)(await browser.EvaluateAsync("document.querySelectorAll('svg.tree g.node[data-statement=\"0\"]').length"))!);
        Assert.Equal(Claims, (await browser.EvaluateAsync(VisibleRows))!.AsArray().Count);
        await browser.ScreenshotAsync(ScreenshotPath);

        // Only the settled claims: untick the other three statuses with real clicks.
        await browser.EvaluateAsync("['overturned', 'contested', 'failed'].forEach(s => document.querySelector(`input[data-status-filter=\"${s}\"]`).click())");
        var settled = (await browser.EvaluateAsync(VisibleRows))!.AsArray().Select(n => (string)n!).ToList();
        Assert.Equal(SampleSweepTests.ExpectedVerdicts.Where(r => (string)r[3] == "settled").Select(r => (string)r[0]), settled);
        Assert.Equal(WithStatus("settled").ToString(System.Globalization.CultureInfo.InvariantCulture), (string)(await browser.EvaluateAsync("document.getElementById('shown').textContent"))!);
        Assert.Equal(WithStatus("settled"), (int)(await browser.EvaluateAsync("Array.from(document.querySelectorAll('article.claim')).filter(a => !a.hidden).length"))!);

        // Then type into the text filter: of the settled claims, those with "blender" in id or text (blender-jug,
        // overturned, stays hidden by the status filter).
        await browser.EvaluateAsync("document.getElementById('filter-text').focus()");
        await browser.TypeAsync("blender");
        Assert.Equal(["blender-online"], (await browser.EvaluateAsync(VisibleRows))!.AsArray().Select(n => (string)n!));

        Assert.Empty(browser.Errors);
        Assert.True(new FileInfo(ScreenshotPath).Length > 10_000, "the screenshot is too small to show the report");
    }
}
