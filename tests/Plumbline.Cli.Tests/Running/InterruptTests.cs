using System.Runtime.CompilerServices;
using System.Text.Json;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Cli.Tests.Doubles;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;

namespace Plumbline.Cli.Tests.Running;

public sealed class InterruptTests
{
    /// <summary>Yields the first claim, then cancels (as Ctrl+C would) just before handing out the second.</summary>
    private static async IAsyncEnumerable<Claim> CancelAfterFirst(CancellationTokenSource interrupt, [EnumeratorCancellation] CancellationToken cancellationToken = default)
    {
        yield return new Claim("first", TestClaims.Bats);
        await interrupt.CancelAsync();
        yield return new Claim("second", TestClaims.Sun);
    }

    [Fact]
    public async Task Run_InterruptedAfterOneVerdict_WritesThatVerdictAndExitsThree()
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9), (TestClaims.Sun, 0.2));
        var settings = new JudgeSettings(
            ModelSettingsFor.Recording(recording),
            NliModelOption.ShippedDirectory,
            CoherenceOptions.Default,
            ExportWcnfDirectory: null,
            new OutputSettings("json", Path: null));
        using var interrupt = new CancellationTokenSource();
        using var output = new StringWriter();
        using var error = new StringWriter();

        var code = await JudgeComposition.RunAsync(settings, CancelAfterFirst(interrupt), new CliContext(output, error), interrupt.Token);

        Assert.Equal(3, code);
        using var report = JsonDocument.Parse(output.ToString());
        Assert.Equal(["first"], ReportJson.Ids(report));
        Assert.NotEqual("failed", ReportJson.Status(report, "first"));
        Assert.Equal("plumb: interrupted; stopped after 1 claim(s)", error.ToString().Trim());
    }
}
