using System.Runtime;
using Plumbline.Application.Running;

namespace Plumbline.Cli.Hosting;

/// <summary>
/// When the run starts and every <see cref="Every"/> claims, a full compacting garbage collection (the large object
/// heap included) and glibc's <c>malloc_trim</c>, so that a long run's resident memory stays where a short one's is.
/// </summary>
/// <remarks>
/// What a run holds live is small and nearly flat (after a full collection, 5.0 MiB at 1,000 claims and 10.5 at
/// 4,000 in the pipeline-memory benchmark), but each claim's objects live for the second its NLI scoring takes, so
/// they reach the oldest generation and die there, and the runtime collects that generation seldom (5 times in a
/// 1,000-claim run, 6 in 4,000): the heap it kept committed grew from 29 to 65 MiB, and on to 97 at 10,000 claims.
/// A blocking collection of a heap this size takes milliseconds, once per few hundred claims of about a second each.
/// The trim at the start returns what loading left behind before the first claims add theirs. Building the index of a
/// 10,000-claim recording outgrows its tables again and again, and each outgrown table (megabytes, so on the large
/// object heap, which a compacting collection leaves in place unless told otherwise) stayed as a hole the heap kept
/// resident: the run's resident memory sat 32 MiB above a 1,000-claim run's from the start (174 against 142 MiB
/// once started) and its peak was 223 to 230 MiB against 193 to 199. Compacting the large object heap too, at every
/// trim, brought it to 157 once started, 194 to 198 through the run and a peak of 208.9 MiB against 195.8.
/// </remarks>
public sealed class HeapTrimSink : IRunSink
{
    /// <summary>Claims between two trims.</summary>
    public const int Every = 200;

    public string Name => "memory trim";

    public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken)
    {
        Trim();
        return Task.CompletedTask;
    }

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken)
    {
        if (ready.Position % Every == 0)
        {
            Trim();
        }

        return Task.CompletedTask;
    }

    public Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken) => Task.CompletedTask;

    private static void Trim()
    {
        // Applies to the next blocking full collection only, so it is set before each one.
        GCSettings.LargeObjectHeapCompactionMode = GCLargeObjectHeapCompactionMode.CompactOnce;
        GC.Collect(GC.MaxGeneration, GCCollectionMode.Forced, blocking: true, compacting: true);
        NativeHeap.Trim();
    }
}
