using Plumbline.Cli.Hosting;
using Xunit;

namespace Plumbline.Cli.Tests.Hosting;

public sealed class NativeHeapTests
{
    // The tests run on Linux with glibc (Debian); there the call must reach mallopt and be accepted, unless the
    // environment already chose the arena count, which plumb then leaves as it is.
    [Fact]
    public void LimitArenas_LinuxWithGlibc_SetsTheLimitUnlessTheEnvironmentSetOne()
    {
        var chosenByEnvironment = Environment.GetEnvironmentVariable("MALLOC_ARENA_MAX") is not null;

        var set = NativeHeap.LimitArenas();

        Assert.True(OperatingSystem.IsLinux(), "these tests run on Linux");
        Assert.Equal(!chosenByEnvironment, set);
    }
}
