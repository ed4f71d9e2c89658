using System.Text.Json;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>The collector settings plumb starts with (src/Plumbline.Cli/GarbageCollection.props says why).</summary>
public sealed class RuntimeConfigTests
{
    [Fact]
    public void PlumbRuntimeConfig_BackgroundCollectionOff()
    {
        var path = Path.ChangeExtension(PlumbProcess.PlumbDll, ".runtimeconfig.json");
        using var config = JsonDocument.Parse(File.ReadAllText(path));

        var properties = config.RootElement.GetProperty("runtimeOptions").GetProperty("configProperties");

        Assert.False(properties.GetProperty("System.GC.Concurrent").GetBoolean());
    }

    [Fact]
    public void PlumbRuntimeConfig_YoungGenerationBudgetCappedAtSixMiB()
    {
        var path = Path.ChangeExtension(PlumbProcess.PlumbDll, ".runtimeconfig.json");
        using var config = JsonDocument.Parse(File.ReadAllText(path));

        var properties = config.RootElement.GetProperty("runtimeOptions").GetProperty("configProperties");

        Assert.Equal(6 << 20, properties.GetProperty("System.GC.Gen0MaxBudget").GetInt64());
    }
}
