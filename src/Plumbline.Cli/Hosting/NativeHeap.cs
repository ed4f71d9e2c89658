using System.Runtime.InteropServices;

namespace Plumbline.Cli.Hosting;

/// <summary>
/// Settings of the C library's allocator, which ONNX Runtime and OR-Tools allocate from.
/// </summary>
/// <remarks>
/// glibc gives threads up to eight allocation arenas per core, and each keeps memory its threads freed. A run spreads
/// native work over many thread-pool threads, so retained native memory grew with the claim count while the managed
/// heap grew little: the pipeline-memory benchmark's peak was 276 MiB at 1,000 claims, 312 to 316 at 3,000 and 337
/// at 10,000 (five arenas in use). Limited to two from here, it was 276 and 320 MiB at 1,000 and 10,000 claims. Set
/// from the environment before the process starts (MALLOC_ARENA_MAX=2) it did better, 272 and 279 MiB at 1,000 and
/// 3,000, because the runtime's own threads have made arenas by the time this runs; the rest of the growth is free
/// memory the main arena keeps (malloc_trim gave back 29 MiB at the end of a 10,000-claim run).
/// </remarks>
public static class NativeHeap
{
    /// <summary>The arenas glibc may create (past those that exist when it is set); what the measurements above used.</summary>
    public const int Arenas = 2;

    private const int ArenaMaxParameter = -8; // M_ARENA_MAX in malloc.h

    /// <summary>Limits glibc's allocation arenas to <see cref="Arenas"/>, unless <c>MALLOC_ARENA_MAX</c> already says
    /// how many (glibc reads it at start). Call it first thing, before native libraries start threads: arenas that
    /// exist stay. Returns whether the limit was set; elsewhere than glibc on Linux it does nothing.</summary>
    public static bool LimitArenas()
    {
        if (!OperatingSystem.IsLinux() || Environment.GetEnvironmentVariable("MALLOC_ARENA_MAX") is not null)
        {
            return false;
        }

        try
        {
            return MallOpt(ArenaMaxParameter, Arenas) == 1;
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException)
        {
            // Another C library (musl has no per-thread arenas to limit).
            return false;
        }
    }

    /// <summary>Hands free memory at the top of glibc's heaps back to the system (<c>malloc_trim(0)</c>); returns whether
    /// any was. Elsewhere than glibc on Linux it does nothing.</summary>
    public static bool Trim()
    {
        if (!OperatingSystem.IsLinux())
        {
            return false;
        }

        try
        {
            return MallocTrim(0) == 1;
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException)
        {
            return false;
        }
    }

    // DllImport rather than LibraryImport: the latter needs unsafe code allowed in the project for one int call.
    [DllImport("libc.so.6", EntryPoint = "mallopt")]
    private static extern int MallOpt(int parameter, int value);

    [DllImport("libc.so.6", EntryPoint = "malloc_trim")]
    private static extern int MallocTrim(nuint pad);
}
