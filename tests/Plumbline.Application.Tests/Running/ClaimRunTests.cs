using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Application.Tests.Doubles;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;

namespace Plumbline.Application.Tests.Running;

public sealed class ClaimRunTests
{
    private static readonly RunSettings Settings = RunSettings.From(CoherenceOptions.Default, "scripted", "nli", "solver", seed: null);

    private static ClaimInput Input(int count) =>
        ClaimInput.FromClaims("test", [.. Enumerable.Range(1, count).Select(i => new Claim($"k{i}", $"Claim number {i}."))]);

    private static async Task<RunOutcome> RunAsync(
        IClaimJudge judge,
        ClaimInput input,
        IReadOnlyList<IRunSink> sinks,
        int inFlight = 3,
        Func<RunFigures, IReadOnlyList<GateResult>>? gates = null,
        CollectedDiagnostics? diagnostics = null,
        CancellationToken cancellationToken = default)
    {
        var run = new ClaimRun(judge, Settings, TimeProvider.System, new RunOptions("0.1.0", inFlight));
        await using var store = new MemoryClaimStore();
        return await run.RunAsync(input, store, new SinkSet(sinks, diagnostics ?? new CollectedDiagnostics()), gates, cancellationToken);
    }

    [Fact]
    public async Task RunAsync_LaterClaimsFinishFirst_VerdictsStillInInputOrder()
    {
        // k1 takes longest, k6 is instant: with three in flight, later claims finish before earlier ones.
        var judge = new ScriptedJudge { Delay = c => TimeSpan.FromMilliseconds(60 - 10 * int.Parse(c.Id[1..], System.Globalization.CultureInfo.InvariantCulture)) };
        var sink = new RecordingSink();

        var outcome = await RunAsync(judge, Input(6), [sink], inFlight: 3);

        Assert.Equal(["k1", "k2", "k3", "k4", "k5", "k6"], sink.Claims);
        Assert.Equal("started 6", sink.Events[0]);
        Assert.Equal("finished", sink.Events[^1]);
        Assert.Equal(ExitCodes.Success, outcome.ExitCode);
        Assert.True(outcome.Report.Completion.IsComplete);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(3)]
    public async Task RunAsync_InFlightLimit_NeverMoreClaimsAtOnce(int inFlight)
    {
        var judge = new ScriptedJudge { Delay = _ => TimeSpan.FromMilliseconds(20) };

        await RunAsync(judge, Input(8), [new RecordingSink()], inFlight);

        Assert.Equal(inFlight, judge.MaxInFlight);
    }

    [Fact]
    public async Task RunAsync_Figures_FoldedFromEveryVerdict()
    {
        var judge = new ScriptedJudge();
        var sink = new RecordingSink();

        var outcome = await RunAsync(judge, Input(5), [sink]);

        var figures = outcome.Report.Figures;
        Assert.Equal((5, 5, 5, 15), (figures.Claims, figures.Judged, figures.Settled, figures.ModelCalls));
        Assert.Equal(5, outcome.Report.Claims.Count);
    }

    [Fact]
    public async Task RunAsync_InterruptedAfterTwoVerdicts_KeepsThemListsTheRestAndExitsThree()
    {
        using var interrupt = new CancellationTokenSource();
        var judge = new ScriptedJudge { Delay = c => c.Id is "k1" or "k2" ? TimeSpan.Zero : TimeSpan.FromSeconds(30) };
        var sink = new RecordingSink { OnVerdict = ready => { if (ready.Position == 2) { interrupt.Cancel(); } } };

        var outcome = await RunAsync(judge, Input(6), [sink], inFlight: 2, cancellationToken: interrupt.Token);

        Assert.Equal(["k1", "k2"], sink.Claims);
        Assert.Equal("interrupted", outcome.Report.Completion.StoppedBecause);
        Assert.Equal(["k3", "k4", "k5", "k6"], outcome.Report.Completion.NotJudged);
        Assert.Equal(2, outcome.Report.Figures.Claims);
        Assert.Equal("finished", sink.Events[^1]);
        Assert.Equal(ExitCodes.Incomplete, outcome.ExitCode);
    }

    [Fact]
    public async Task RunAsync_BudgetHaltsOnThirdClaim_StopsWithItsReasonAndListsTheRest()
    {
        var judge = new ScriptedJudge { Throws = c => c.Id == "k3" ? new RunHaltedException("call budget of 20 spent") : null };
        var sink = new RecordingSink();

        var outcome = await RunAsync(judge, Input(5), [sink], inFlight: 1);

        Assert.Equal(["k1", "k2"], sink.Claims);
        Assert.Equal("call budget of 20 spent", outcome.Report.Completion.StoppedBecause);
        Assert.Equal(["k3", "k4", "k5"], outcome.Report.Completion.NotJudged);
        Assert.Null(outcome.Bug);
        Assert.Equal(ExitCodes.Incomplete, outcome.ExitCode);
    }

    [Fact]
    public async Task RunAsync_UnexpectedException_IsABugThatStopsTheRunCleanly()
    {
        var judge = new ScriptedJudge { Throws = c => c.Id == "k2" ? new InvalidOperationException("index out of step") : null };
        var sink = new RecordingSink();

        var outcome = await RunAsync(judge, Input(3), [sink], inFlight: 1);

        Assert.IsType<InvalidOperationException>(outcome.Bug);
        Assert.Equal(["k1"], sink.Claims);
        Assert.Equal("internal error while judging claim k2: InvalidOperationException: index out of step", outcome.Report.Completion.StoppedBecause);
        Assert.Equal(["k2", "k3"], outcome.Report.Completion.NotJudged);
        Assert.Equal(ExitCodes.Incomplete, outcome.ExitCode);
    }

    [Fact]
    public async Task RunAsync_OneSinkThrows_OthersGetEveryVerdictAndTheProblemIsRecorded()
    {
        var failing = new RecordingSink("report html to out.html") { ThrowOnVerdict = 2 };
        var healthy = new RecordingSink();
        var diagnostics = new CollectedDiagnostics();

        var outcome = await RunAsync(new ScriptedJudge(), Input(4), [failing, healthy], diagnostics: diagnostics);

        Assert.Equal(["k1", "k2", "k3", "k4"], healthy.Claims);
        Assert.Equal(["k1", "k2"], failing.Claims);
        Assert.Null(failing.Finished);
        var problem = Assert.Single(outcome.Problems);
        Assert.Equal("report html to out.html failed: disk full", problem.Message);
        Assert.Equal([problem], diagnostics.Problems);
        Assert.Equal(4, outcome.Report.Figures.Claims);
        Assert.Equal(ExitCodes.Incomplete, outcome.ExitCode);
    }

    [Fact]
    public async Task RunAsync_OutputClosed_StopsQuietly()
    {
        var closed = new RecordingSink("report jsonl to standard output") { ThrowOnVerdict = 1, ToThrow = new OutputClosedException() };
        var diagnostics = new CollectedDiagnostics();

        var outcome = await RunAsync(new ScriptedJudge { Delay = _ => TimeSpan.FromMilliseconds(5) }, Input(50), [closed], inFlight: 1, diagnostics: diagnostics);

        Assert.True(outcome.OutputClosed);
        Assert.Empty(diagnostics.Problems);
        Assert.Equal(OutputClosedException.Reason, outcome.Report.Completion.StoppedBecause);
        Assert.True(outcome.Report.Figures.Claims < 50, $"{outcome.Report.Figures.Claims} claims judged after the output closed");
        Assert.Equal(ExitCodes.Incomplete, outcome.ExitCode);
    }

    [Fact]
    public async Task RunAsync_GateFails_ExitOne()
    {
        IReadOnlyList<GateResult> Gates(RunFigures figures) => [new GateResult("overturn_rate", figures.OverturnRate, "<=", 0.0, figures.OverturnRate <= 0.0), new GateResult("claims", figures.Claims, ">=", 10, figures.Claims >= 10)];

        var outcome = await RunAsync(new ScriptedJudge(), Input(2), [new RecordingSink()], gates: Gates);

        Assert.Equal([true, false], outcome.Report.Gates.Select(g => g.Passed));
        Assert.Equal(ExitCodes.GateFailed, outcome.ExitCode);
    }

    [Fact]
    public async Task RunAsync_FailedClaimAndFailedGate_IncompleteWins()
    {
        var judge = new FailingJudge("k1");
        IReadOnlyList<GateResult> Gates(RunFigures figures) => [new GateResult("g", 0, ">=", 1, false)];

        var outcome = await RunAsync(judge, Input(2), [new RecordingSink()], gates: Gates);

        Assert.Equal(1, outcome.Report.Figures.Failed);
        Assert.Equal(ExitCodes.Incomplete, outcome.ExitCode);
    }

    /// <summary>Fails the named claim the way the engine fails a claim (a failed verdict), judges the rest.</summary>
    private sealed class FailingJudge(string failing) : IClaimJudge
    {
        public Task<Verdict> JudgeAsync(Claim claim, CancellationToken cancellationToken) =>
            Task.FromResult(claim.Id == failing ? Verdict.Failed(claim, $"claim {claim.Id}: no recorded answer") : ScriptedJudge.Settled(claim));
    }
}
