using System.Text.Json;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>The collector settings plumb starts with (src/Plumbline.Cli/GarbageCollection.props says why).</summary>
public sealed class RuntimeConfigTests
{
    [Fact]
    public void PlumbRuntimeConfig_BackgroundCollectionOff()
    {
        Assert.False(ConfigProperty("System.GC.Concurrent").GetBoolean());
    }

    [Fact]
    public void PlumbRuntimeConfig_YoungGenerationBudgetCappedAtSixMiB()
    {
        Assert.Equal(6 << 20, ConfigProperty("System.GC.Gen0MaxBudget").GetInt64());
    }

    /// <summary>One of the configProperties in plumb's runtimeconfig.json, as the runtime reads it at start.</summary>
    private static JsonElement ConfigProperty(string name)
    {
        var path = Path.ChangeExtension(PlumbProcess.PlumbDll, ".runtimeconfig.json");
        using var config = JsonDocument.Parse(File.ReadAllText(path));
        return config.RootElement.GetProperty("runtimeOptions").GetProperty("configProperties").GetProperty(name).Clone();
    }
}
