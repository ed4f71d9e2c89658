using Plumbline.Cli.Input;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;

namespace Plumbline.Cli.Running;

/// <summary>
/// Judges a stream of claims and keeps every finished verdict, whatever stops the stream: a bad line met
/// after some claims were judged or an interruption still gives a report of what was done.
/// </summary>
internal sealed class JudgeRun(
    CoherenceEngine engine,
    RunSettings settings,
    TimeProvider time,
    WcnfExport? export,
    TextWriter error)
{
    public async Task<JudgeOutcome> RunAsync(IAsyncEnumerable<Claim> claims, CancellationToken cancellationToken)
    {
        var started = time.GetUtcNow();
        var verdicts = new List<Verdict>();
        string? stopped = null;
        try
        {
            await using var reading = claims.GetAsyncEnumerator(cancellationToken);
            while (await reading.MoveNextAsync())
            {
                var claim = reading.Current;
                Verdict verdict;
                try
                {
                    verdict = await engine.JudgeAsync(claim, cancellationToken);
                }
                catch (RunHaltedException halt)
                {
                    // A halt (a spent budget) stops the run; the claim at hand and those after it are not judged.
                    var unjudged = await UnjudgedAsync(claim, reading);
                    stopped = $"{halt.Message}; stopped after {verdicts.Count} claim(s); not judged: {unjudged}";
                    break;
                }

                verdicts.Add(verdict);
                if (verdict.Error is { } reason)
                {
                    await error.WriteLineAsync(CliErrors.Line(reason));
                }

                if (export is not null)
                {
                    await export.WriteAsync(verdict, cancellationToken);
                }
            }
        }
        catch (ClaimFileException e) when (verdicts.Count > 0)
        {
            // Before the first verdict a bad file is a usage error and nothing is reported; after it,
            // the work done so far is worth a report.
            stopped = $"{e.Message}; stopped after {verdicts.Count} claim(s)";
        }
        catch (OperationCanceledException) when (cancellationToken.IsCancellationRequested)
        {
            stopped = $"interrupted; stopped after {verdicts.Count} claim(s)";
        }

        var report = RunReport.Create(ToolVersion.Current, settings, started, time.GetUtcNow(), verdicts);
        return new JudgeOutcome(report, stopped);
    }

    /// <summary>The ids of the claim at hand and of every claim not yet read (reading costs no model call),
    /// at most 20 named, the rest counted.</summary>
    private static async Task<string> UnjudgedAsync(Claim current, IAsyncEnumerator<Claim> rest)
    {
        const int Named = 20;
        var ids = new List<string> { current.Id };
        var more = 0;
        try
        {
            while (await rest.MoveNextAsync())
            {
                if (ids.Count < Named)
                {
                    ids.Add(rest.Current.Id);
                }
                else
                {
                    more++;
                }
            }
        }
        catch (ClaimFileException)
        {
            // The rest of the file is unreadable; what was listed is what is known.
        }

        return string.Join(", ", ids) + (more > 0 ? $" and {more} more" : "");
    }
}

/// <summary>The report of a run and, when the run did not reach the end of its claims, why.</summary>
internal sealed record JudgeOutcome(RunReport Report, string? Stopped)
{
    /// <summary>0 when every claim was read and judged, else 3 (incomplete).</summary>
    public int ExitCode =>
        Stopped is null && Report.Verdicts.All(v => !v.IsFailed) ? ExitCodes.Success : ExitCodes.Incomplete;
}
