using Plumbline.Application.Running;
using Spectre.Console;
using Spectre.Console.Rendering;

namespace Plumbline.Application.Sinks;

/// <summary>Progress on a terminal: a bar with the count, the rate in claims per minute and the time left, cleared at the end.</summary>
public sealed class TerminalProgressSink(TextWriter error) : IRunSink
{
    private readonly TaskCompletionSource finished = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private Task? rendering;
    private ProgressTask? bar;

    public string Name => "progress";

    public async Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken)
    {
        var console = AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(error) });
        var ready = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        rendering = console.Progress()
            .AutoClear(true)
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new CountColumn(), new RateColumn(), new RemainingTimeColumn())
            .StartAsync(async context =>
            {
                bar = context.AddTask("judging", maxValue: Math.Max(1, started.ExpectedClaims));
                ready.SetResult();
                await finished.Task;
                bar.Value = bar.MaxValue;
            });
        await ready.Task;
    }

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken)
    {
        bar?.Increment(1);
        return Task.CompletedTask;
    }

    public async Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken)
    {
        this.finished.TrySetResult();
        if (rendering is not null)
        {
            await rendering;
        }
    }

    /// <summary>"120/1000".</summary>
    private sealed class CountColumn : ProgressColumn
    {
        public override IRenderable Render(RenderOptions options, ProgressTask task, TimeSpan deltaTime) =>
            new Text(FormattableString.Invariant($"{task.Value:0}/{task.MaxValue:0}"));
    }

    /// <summary>"31.5 claims/min", from the task's measured speed (items per second).</summary>
    private sealed class RateColumn : ProgressColumn
    {
        public override IRenderable Render(RenderOptions options, ProgressTask task, TimeSpan deltaTime) =>
            new Text(task.Speed is { } perSecond ? FormattableString.Invariant($"{perSecond * 60:0.0} claims/min") : "");
    }
}
