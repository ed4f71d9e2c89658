using System.Globalization;
using Plumbline.Application.Running;

namespace Plumbline.Benchmarks.Pipeline;

/// <summary>
/// Resident memory at the moments a whole run's memory is decided: models loaded, the run started (after its
/// start trim), every <see cref="Every"/> claims, the run over, and each report written. Written as one line at the
/// end, so the pipeline-memory benchmark can say where a peak came from.
/// </summary>
internal sealed class ResidentTimeline(TextWriter output) : IRunSink
{
    private const int Every = 1_000;
    private readonly List<string> marks = [];

    public string Name => "resident timeline";

    /// <summary>Notes the resident set now under <paramref name="label"/>.</summary>
    public void Mark(string label) => marks.Add(FormattableString.Invariant($"{label} {ResidentMiB():0}"));

    public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken)
    {
        Mark("started");
        return Task.CompletedTask;
    }

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken)
    {
        if (ready.Position % Every == 0)
        {
            Mark(ready.Position.ToString(CultureInfo.InvariantCulture));
        }

        return Task.CompletedTask;
    }

    /// <summary>Runs before the report sinks write; <see cref="After"/> marks each report's end.</summary>
    public Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken)
    {
        Mark("run over");
        return Task.CompletedTask;
    }

    /// <summary>A sink to put after another in the run's list: marks the moment that one has finished its report.</summary>
    public IRunSink After(string label) => new FinishMark(this, label);

    public void Finish() => output.WriteLine("resident MiB: " + string.Join(", ", marks));

    private static double ResidentMiB()
    {
        foreach (var line in File.ReadLines("/proc/self/status"))
        {
            if (line.StartsWith("VmRSS:", StringComparison.Ordinal))
            {
                return long.Parse(line["VmRSS:".Length..].Trim().Split(' ')[0], CultureInfo.InvariantCulture) / 1024.0;
            }
        }

        return double.NaN;
    }

    private sealed class FinishMark(ResidentTimeline timeline, string label) : IRunSink
    {
        public string Name => "resident mark";

        public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken) => Task.CompletedTask;

        public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken) => Task.CompletedTask;

        public Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken)
        {
            timeline.Mark(label);
            return Task.CompletedTask;
        }
    }
}
