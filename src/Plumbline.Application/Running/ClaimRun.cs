using System.Threading.Channels;
using Plumbline.Application.Input;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>
/// The run loop. It reads claims, keeps up to <see cref="RunOptions.InFlight"/> of them being judged at once, and
/// hands each verdict to the sinks in input order as soon as it and every claim before it are done. Figures are
/// folded as verdicts arrive; each claim's report goes to the store, and its verdict is then let go, so memory
/// stays flat however long the input. Whatever stops the run (an interruption, a halted budget, a closed output,
/// a bug) it stops cleanly: the claims already finished are handed on, the rest are listed as not judged, and the
/// sinks are finished with the report.
/// </summary>
public sealed class ClaimRun(IClaimJudge judge, RunSettings settings, TimeProvider time, RunOptions options)
{
    /// <summary>Judges <paramref name="input"/>; only a failure before the first event throws.</summary>
    /// <param name="input">The claims, checked.</param>
    /// <param name="store">Where claim reports are kept for the writers that need the whole run.</param>
    /// <param name="sinks">Who gets the events.</param>
    /// <param name="gates">Gates to check on the figures; null for none.</param>
    /// <param name="cancellationToken">Interrupts the run (Ctrl+C); the run still finishes its sinks.</param>
    public async Task<RunOutcome> RunAsync(
        ClaimInput input,
        IClaimStore store,
        SinkSet sinks,
        Func<RunFigures, IReadOnlyList<GateResult>>? gates,
        CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(input);
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(sinks);
        ArgumentOutOfRangeException.ThrowIfLessThan(options.InFlight, 1);

        var header = RunHeader.Create(options.ToolVersion, settings, time.GetUtcNow(), options.Listing);
        var startedAt = time.GetTimestamp();
        using var state = new RunState(cancellationToken);
        var problems = input.Problems.Select(p => new RunProblem("input", p.Message)).ToList();
        await sinks.StartedAsync(new RunStarted(header, input.Count), CancellationToken.None);

        var tally = new RunTally();
        var notJudged = new List<string>();
        var pending = Channel.CreateUnbounded<(Claim Claim, Task<Verdict> Verdict)>(new UnboundedChannelOptions { SingleReader = true, SingleWriter = true });
        using var slots = new SemaphoreSlim(options.InFlight, options.InFlight);
        var producer = ProduceAsync(input, pending.Writer, slots, state);

        var position = 0;
        await foreach (var (claim, task) in pending.Reader.ReadAllAsync(CancellationToken.None))
        {
            var verdict = await FinishAsync(claim, task, state);
            slots.Release();
            if (verdict is null)
            {
                notJudged.Add(claim.Id);
                continue;
            }

            tally.Add(verdict);
            var report = ClaimReportBuilder.From(verdict, options.Listing);
            try
            {
                await store.AddAsync(report, CancellationToken.None);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                state.Stop($"cannot keep claim reports for the final reports: {e.Message}");
            }

            await sinks.ReadyAsync(new VerdictReady(verdict, report, ++position), CancellationToken.None);
            if (sinks.OutputClosed)
            {
                state.Stop(OutputClosedException.Reason);
            }
        }

        var read = await producer;
        if (cancellationToken.IsCancellationRequested)
        {
            state.Stop("interrupted");
        }

        if (state.Reason is not null)
        {
            // Unread claims are listed by reading on without judging: the input was checked, so this only costs I/O.
            var index = 0;
            await foreach (var claim in input.ReadAsync(CancellationToken.None))
            {
                if (index++ >= read)
                {
                    notJudged.Add(claim.Id);
                }
            }
        }

        var figures = tally.ToFigures(time.GetElapsedTime(startedAt));
        var completion = new RunCompletion(state.Reason, notJudged, [.. problems, .. sinks.Problems]);
        var finished = new RunReport(header, time.GetUtcNow(), figures, gates?.Invoke(figures) ?? [], completion, store);
        await sinks.FinishedAsync(new RunFinished(finished), CancellationToken.None);
        return new RunOutcome(finished, [.. problems, .. sinks.Problems], state.Bug, sinks.OutputClosed);
    }

    /// <summary>Starts a judge task per claim as slots free up; returns how many claims it handed on.</summary>
    private async Task<int> ProduceAsync(ClaimInput input, ChannelWriter<(Claim, Task<Verdict>)> pending, SemaphoreSlim slots, RunState state)
    {
        var read = 0;
        try
        {
            await foreach (var claim in input.ReadAsync(state.Token))
            {
                await slots.WaitAsync(state.Token);
                var verdict = Task.Run(() => judge.JudgeAsync(claim, state.Token), CancellationToken.None);
                await pending.WriteAsync((claim, verdict), CancellationToken.None);
                read++;
            }
        }
        catch (OperationCanceledException) when (state.Token.IsCancellationRequested)
        {
            // Stopped; the consumer lists what was not read.
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            state.Stop($"reading {input.Name} failed: {e.Message}");
        }
        finally
        {
            pending.Complete();
        }

        return read;
    }

    /// <summary>The claim's verdict, or null when the run stopped before it was judged.</summary>
    private static async Task<Verdict?> FinishAsync(Claim claim, Task<Verdict> task, RunState state)
    {
        try
        {
            return await task;
        }
        catch (OperationCanceledException) when (state.Token.IsCancellationRequested)
        {
            state.Stop("interrupted");
        }
        catch (RunHaltedException halted)
        {
            state.Stop(halted.Message);
        }
        catch (Exception e)
        {
            state.Failed(claim, e);
        }

        return null;
    }

    /// <summary>Why and how the run stopped; the first reason wins.</summary>
    private sealed class RunState : IDisposable
    {
        private readonly CancellationTokenSource stop;

        public RunState(CancellationToken interrupt) => stop = CancellationTokenSource.CreateLinkedTokenSource(interrupt);

        public CancellationToken Token => stop.Token;

        public string? Reason { get; private set; }

        public Exception? Bug { get; private set; }

        public void Stop(string reason)
        {
            Reason ??= reason;
            stop.Cancel();
        }

        public void Failed(Claim claim, Exception bug)
        {
            Bug ??= bug;
            Stop($"internal error while judging claim {claim.Id}: {bug.GetType().Name}: {bug.Message}");
        }

        public void Dispose() => stop.Dispose();
    }
}
