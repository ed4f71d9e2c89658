using System.Runtime.InteropServices;
using Plumbline.Application.Running;
using Plumbline.Cli.Hosting;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Reports.Model;
using Xunit;

namespace Plumbline.Cli.Tests.Hosting;

public sealed class HeapTrimSinkTests
{
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
