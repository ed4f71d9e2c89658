using Microsoft.Extensions.Time.Testing;
using Plumbline.Application.Running;
using Plumbline.Application.Sinks;
using Plumbline.Application.Tests.Doubles;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Tests.Sinks;

public sealed class PlainProgressSinkTests
{
    private static readonly RunHeader Header = RunHeader.Create("0.1.0", RunSettings.From(CoherenceOptions.Default, "m", "n", "s", null), DateTimeOffset.UnixEpoch);

    private static VerdictReady Ready(int position, bool failed = false)
    {
        var claim = new Claim($"k{position}", "A claim.");
        var verdict = failed ? Verdict.Failed(claim, "claim failed") : ScriptedJudge.Settled(claim);
        return new VerdictReady(verdict, ClaimReportBuilder.From(verdict), position);
    }

    [Fact]
    public async Task VerdictReady_OneLineAtMostPerInterval_WithRateAndTimeLeft()
    {
        var time = new FakeTimeProvider();
        using var error = new StringWriter();
        var sink = new PlainProgressSink(error, time, TimeSpan.FromSeconds(10));
        await sink.RunStartedAsync(new RunStarted(Header, 100), CancellationToken.None);

        // 5 claims in the first 5 s: no line yet. 10 claims by 10 s (one failed): a line.
        for (var i = 1; i <= 10; i++)
        {
            time.Advance(TimeSpan.FromSeconds(1));
            await sink.VerdictReadyAsync(Ready(i, failed: i == 3), CancellationToken.None);
        }

        time.Advance(TimeSpan.FromSeconds(1));
        await sink.VerdictReadyAsync(Ready(11), CancellationToken.None);

        // By hand: 10 claims in 10 s = 60 claims/min; 90 left at that rate = 1.5 min = 90 s.
        var line = Assert.Single(error.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.Equal("plumb: progress 10 of 100 claims (1 failed), 60.0 claims/min, about 90 s left", line.TrimEnd('\r'));
    }

    [Theory]
    [InlineData(30, "30 s")]
    [InlineData(600, "10 min")]
    [InlineData(7200, "2.0 h")]
    public void Duration_Spelled(int seconds, string expected) =>
        Assert.Equal(expected, PlainProgressSink.Duration(TimeSpan.FromSeconds(seconds)));
}
