using Plumbline.Application.Running;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Tests.Running;

public sealed class ExitCodeDecisionTests
{
    private static readonly RunHeader Header =
        RunHeader.Create("0.1.0", RunSettings.From(CoherenceOptions.Default, "scripted", "nli", "solver", seed: null), DateTimeOffset.UnixEpoch);

    /// <summary>Three claims, <paramref name="failed"/> of them failed, the rest settled with their gold label.</summary>
    private static RunFigures Figures(int failed) => RunFigures.From(
        Enumerable.Range(1, 3).Select(i => i <= failed
            ? Verdict.Failed(new Claim($"k{i}", "text", true), "no recorded answer")
            : Doubles.ScriptedJudge.Settled(new Claim($"k{i}", "text", true))),
        TimeSpan.Zero);

    private static RunReport Report(RunFigures figures, IEnumerable<Gate> gates, RunCompletion? completion = null) =>
        new(Header, DateTimeOffset.UnixEpoch, figures, Gate.CheckAll(gates, figures), completion ?? RunCompletion.Complete, ClaimReportList.Empty);

    [Fact]
    public void Of_FailedClaimWithoutFailedGate_Incomplete() =>
        Assert.Equal(ExitCodes.Incomplete, ExitCodeDecision.Of(Report(Figures(failed: 1), [new Gate(GateFigure.CoherentAccuracy, 0.5)])));

    [Fact]
    public void Of_FailedClaimsWithinMaxFailed_Passes() =>
        Assert.Equal(ExitCodes.Success, ExitCodeDecision.Of(Report(Figures(failed: 1), [new Gate(GateFigure.FailedClaims, 1)])));

    [Fact]
    public void Of_FailedClaimsOverMaxFailed_GateFails() =>
        Assert.Equal(ExitCodes.GateFailed, ExitCodeDecision.Of(Report(Figures(failed: 2), [new Gate(GateFigure.FailedClaims, 1)])));

    [Fact]
    public void Of_MaxFailedButInterrupted_IncompleteStillWins() =>
        Assert.Equal(ExitCodes.Incomplete, ExitCodeDecision.Of(Report(
            Figures(failed: 0), [new Gate(GateFigure.FailedClaims, 5)], new RunCompletion("interrupted", ["k3"], []))));

    [Fact]
    public void Of_EveryGatePasses_Zero() =>
        Assert.Equal(ExitCodes.Success, ExitCodeDecision.Of(Report(Figures(failed: 0), [new Gate(GateFigure.CoherentAccuracy, 1.0), new Gate(GateFigure.OverturnRate, 0)])));

    [Fact]
    public void Of_OneGateFails_One() =>
        Assert.Equal(ExitCodes.GateFailed, ExitCodeDecision.Of(Report(Figures(failed: 0), [new Gate(GateFigure.CoherentAccuracy, 1.0), new Gate(GateFigure.MeanMargin, 0.7)])));
}
