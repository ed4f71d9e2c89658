using System.Globalization;
using Plumbline.Application.Running;

namespace Plumbline.Application.Sinks;

/// <summary>Progress for a log (standard error not a terminal): one plain line at most every <paramref name="every"/>.</summary>
public sealed class PlainProgressSink(TextWriter error, TimeProvider time, TimeSpan every) : IRunSink
{
    /// <summary>A line every ten seconds: often enough to show life in a CI log, rare enough not to flood it.</summary>
    public static readonly TimeSpan DefaultInterval = TimeSpan.FromSeconds(10);

    private long started, lastLine;
    private int total, done, failed;

    public string Name => "progress";

    public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken)
    {
        total = started.ExpectedClaims;
        this.started = lastLine = time.GetTimestamp();
        return Task.CompletedTask;
    }

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken)
    {
        done++;
        failed += ready.Report.Error is null ? 0 : 1;
        if (time.GetElapsedTime(lastLine) >= every && done < total)
        {
            lastLine = time.GetTimestamp();
            error.WriteLine(DiagnosticText.Line(Line(done, failed, total, time.GetElapsedTime(started))));
        }

        return Task.CompletedTask;
    }

    public Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken) => Task.CompletedTask;

    /// <summary>"progress 120 of 1000 claims (2 failed), 30.0 claims/min, about 29 min left".</summary>
    internal static string Line(int done, int failed, int total, TimeSpan elapsed)
    {
        var perMinute = elapsed > TimeSpan.Zero ? done / elapsed.TotalMinutes : 0;
        var left = perMinute > 0 ? TimeSpan.FromMinutes((total - done) / perMinute) : (TimeSpan?)null;
        var c = CultureInfo.InvariantCulture;
        return string.Create(c, $"progress {done} of {total} claims")
            + (failed > 0 ? string.Create(c, $" ({failed} failed)") : "")
            + string.Create(c, $", {perMinute:0.0} claims/min")
            + (left is { } l ? $", about {Duration(l)} left" : "");
    }

    internal static string Duration(TimeSpan span) => span.TotalMinutes >= 90
        ? string.Create(CultureInfo.InvariantCulture, $"{span.TotalHours:0.0} h")
        : span.TotalSeconds >= 120
            ? string.Create(CultureInfo.InvariantCulture, $"{Math.Round(span.TotalMinutes):0} min")
            : string.Create(CultureInfo.InvariantCulture, $"{Math.Max(1, Math.Round(span.TotalSeconds)):0} s");
}
