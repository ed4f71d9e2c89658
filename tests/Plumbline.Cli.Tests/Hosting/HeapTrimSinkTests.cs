using System.Runtime.InteropServices;
using Plumbline.Application.Running;
using Plumbline.Cli.Hosting;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;
using Xunit;

namespace Plumbline.Cli.Tests.Hosting;

public sealed class HeapTrimSinkTests
{
    private static readonly RunHeader Header =
        RunHeader.Create("0.1.0", RunSettings.From(CoherenceOptions.Default, "m", "n", "s", null), DateTimeOffset.UnixEpoch);

    private static VerdictReady Ready(int position)
    {
        var verdict = Verdict.Failed(new Claim($"c{position}", "A claim."), "failed on purpose");
        return new VerdictReady(verdict, ClaimReportBuilder.From(verdict), position);
    }

    [Fact]
    public async Task VerdictReady_EveryNthClaim_RunsAFullCollection()
    {
        var sink = new HeapTrimSink();
        var before = GC.CollectionCount(GC.MaxGeneration);

        await sink.VerdictReadyAsync(Ready(HeapTrimSink.Every), CancellationToken.None);

        Assert.True(GC.CollectionCount(GC.MaxGeneration) > before, "no full collection after the trim position");
    }

    // Tables outgrown while loading leave megabyte holes in the large object heap, which a compacting collection
    // leaves in place unless asked to compact that heap too.
    [Fact]
    public async Task VerdictReady_AtATrimPosition_CompactsTheLargeObjectHeap()
    {
        var kept = new List<byte[]>();
        var blocks = new byte[24][];
        for (var i = 0; i < blocks.Length; i++)
        {
            blocks[i] = new byte[1 << 20];
            blocks[i][0] = 1;
        }

        for (var i = 0; i < blocks.Length; i += 2)
        {
            kept.Add(blocks[i]);
        }

        Array.Clear(blocks);
        await new HeapTrimSink().VerdictReadyAsync(Ready(HeapTrimSink.Every), CancellationToken.None);

        var largeObjectHeap = GC.GetGCMemoryInfo(GCKind.FullBlocking).GenerationInfo[3];
        Assert.True(largeObjectHeap.FragmentationAfterBytes < 4 << 20,
            $"{largeObjectHeap.FragmentationAfterBytes >> 20} MiB of holes left in the large object heap (12 MiB were freed between kept blocks)");
        GC.KeepAlive(kept);
    }

    // What loading the models left behind is collected before the first claim.
    [Fact]
    public async Task RunStarted_RunsAFullCollection()
    {
        var sink = new HeapTrimSink();
        var before = GC.CollectionCount(GC.MaxGeneration);

        await sink.RunStartedAsync(new RunStarted(Header, ExpectedClaims: 3), CancellationToken.None);

        Assert.True(GC.CollectionCount(GC.MaxGeneration) > before, "no full collection when the run started");
    }

    // On Linux with glibc (the tests' Debian), memory freed at the top of the heap goes back to the system.
    [Fact]
    public void Trim_AfterManySmallNativeBlocksAreFreed_GivesMemoryBack()
    {
        var blocks = new nint[20_000];
        for (var i = 0; i < blocks.Length; i++)
        {
            blocks[i] = Marshal.AllocHGlobal(1024);
        }

        foreach (var block in blocks)
        {
            Marshal.FreeHGlobal(block);
        }

        Assert.True(NativeHeap.Trim(), "malloc_trim released nothing");
    }
}
