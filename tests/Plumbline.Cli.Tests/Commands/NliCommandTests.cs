using System.Text.Json;

namespace Plumbline.Cli.Tests.Commands;

public sealed class NliCommandTests
{
    [Fact]
    public async Task Nli_Pair_PrintsThreeProbabilitiesAndTheirArgmaxLabel()
    {
        var result = await Plumb.RunAsync("nli", "A man is playing a guitar on stage.", "A man is playing an instrument.", "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        var scores = new Dictionary<string, double>
        {
            ["entailment"] = root.GetProperty("entailment").GetDouble(),
            ["neutral"] = root.GetProperty("neutral").GetDouble(),
            ["contradiction"] = root.GetProperty("contradiction").GetDouble(),
        };
        Assert.All(scores.Values, p => Assert.InRange(p, 0.0, 1.0));
        Assert.Equal(1.0, scores.Values.Sum(), 1e-5);
        Assert.Equal(scores.MaxBy(s => s.Value).Key, root.GetProperty("label").GetString());
        Assert.False(root.GetProperty("truncated").GetBoolean());
    }

    [Fact]
    public async Task Nli_TextFormat_ShowsEachProbabilityAndTheLabel()
    {
        var result = await Plumb.RunAsync("nli", "The cat sleeps.", "The cat is awake.");

        Assert.True(result.ExitCode == 0, result.ToString());
        var rows = result.Output.Split('\n');
        Assert.Single(rows, r => r.StartsWith("entailment ", StringComparison.Ordinal));
        Assert.Single(rows, r => r.StartsWith("neutral ", StringComparison.Ordinal));
        Assert.Single(rows, r => r.StartsWith("contradiction ", StringComparison.Ordinal));
        Assert.Single(rows, r => r.StartsWith("label ", StringComparison.Ordinal));
    }

    [Fact]
    public async Task Nli_OnlyOneSentence_ExitsTwo()
    {
        var result = await Plumb.RunAsync("nli", "The cat sleeps.");

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: nli: ", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Nli_ModelFolderWithoutModelFiles_ExitsTwoNamingTheFile()
    {
        using var folder = new TempDirectory();

        var result = await Plumb.RunAsync("nli", "a", "b", "--nli-model", folder.Path);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: " + folder.Path, Assert.Single(result.ErrorLines));
    }
}
