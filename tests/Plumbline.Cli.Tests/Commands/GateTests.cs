using System.Text.Json;
using System.Xml.Linq;
using Plumbline.Cli.Tests.EndToEnd;

namespace Plumbline.Cli.Tests.Commands;

/// <summary>
/// Gates on the demo run, whose figures were checked by hand (samples/thistlewick/EXPECTED.md): coherent accuracy
/// 10 of 12 = 0.8333, direct accuracy 8 of 12 = 0.6667, overturn rate 2 of 12 = 0.1667.
/// </summary>
public sealed class GateTests
{
    private static string Sample(string file) => Path.Combine(SampleSweep.RepositoryRoot, SampleSweep.Scenario, file);

    [Fact]
    public async Task Sweep_OneGateFails_ExitOneAndEveryFormatShowsEachGate()
    {
        using var folder = new TempDirectory();
        string[] formats = ["text", "json", "jsonl", "md", "html", "junit"];

        var result = await Plumb.RunAsync(
        [
            "sweep", Sample("claims.jsonl"), "--model", "recording:" + Sample("recording.jsonl"), "--quiet",
            "--min-coherent-accuracy", "0.8", "--max-overturn-rate", "0.05", "--min-direct-accuracy", "0.6666",
            .. formats.SelectMany(f => new[] { "--report", $"{f}:{folder.File("report." + f)}" }),
        ]);

        Assert.True(result.ExitCode == 1, result.ToString());
        string Read(string format) => File.ReadAllText(folder.File("report." + format));

        Assert.Contains("    pass  min_coherent_accuracy = 0.8333 (wanted >= 0.8)\n", Read("text"), StringComparison.Ordinal);
        Assert.Contains("    FAIL  max_overturn_rate = 0.1667 (wanted <= 0.05)\n", Read("text"), StringComparison.Ordinal);
        Assert.Contains("    pass  min_direct_accuracy = 0.6667 (wanted >= 0.6666)\n", Read("text"), StringComparison.Ordinal);

        using var json = JsonDocument.Parse(Read("json"));
        AssertGates(json.RootElement.GetProperty("gates"));
        var summary = File.ReadLines(folder.File("report.jsonl")).Select(l => JsonDocument.Parse(l).RootElement).Last();
        Assert.Equal("summary", summary.GetProperty("record").GetString());
        AssertGates(summary.GetProperty("gates"));

        Assert.Contains("| max_overturn_rate | 0.1667 | &lt;= 0.05 | **fail** |", Read("md"), StringComparison.Ordinal);
        Assert.Contains("| min_coherent_accuracy | 0.8333 | >= 0.8 | pass |", Read("md"), StringComparison.Ordinal);
        Assert.Contains("<tr class=\"fail\"><td>max_overturn_rate</td><td>0.1667</td><td>&lt;= 0.05</td><td>fail</td></tr>", Read("html"), StringComparison.Ordinal);

        var suite = XDocument.Parse(Read("junit")).Descendants("testsuite").Single(s => (string?)s.Attribute("name") == "plumb gates");
        Assert.Equal(["min_coherent_accuracy", "min_direct_accuracy", "max_overturn_rate"], suite.Elements("testcase").Select(c => (string?)c.Attribute("name")));
        Assert.Equal(["max_overturn_rate"], suite.Elements("testcase").Where(c => c.Element("failure") is not null).Select(c => (string?)c.Attribute("name")));
    }

    private static void AssertGates(JsonElement gates)
    {
        var byName = gates.EnumerateArray().ToDictionary(g => g.GetProperty("name").GetString()!);
        Assert.Equal(3, byName.Count);
        Assert.Equal((0.8333, ">=", 0.8, true), Fields(byName["min_coherent_accuracy"]));
        Assert.Equal((0.1667, "<=", 0.05, false), Fields(byName["max_overturn_rate"]));
        Assert.Equal((0.6667, ">=", 0.6666, true), Fields(byName["min_direct_accuracy"]));
    }

    private static (double, string, double, bool) Fields(JsonElement gate) => (
        Math.Round(gate.GetProperty("value").GetDouble(), 4),
        gate.GetProperty("comparison").GetString()!,
        gate.GetProperty("threshold").GetDouble(),
        gate.GetProperty("passed").GetBoolean());

    [Theory]
    [InlineData("--min-coherent-accuracy", "1.5", "--min-coherent-accuracy: '1.5' is not a share (a number from 0 to 1)")]
    [InlineData("--max-failed", "2.5", "--max-failed: '2.5' is not a number of claims (a whole number 0 or more)")]
    [InlineData("--min-mean-margin", "-1", "--min-mean-margin: '-1' is not a margin (a number 0 or more)")]
    public async Task Sweep_BadGateValue_ExitTwoNamingTheOption(string option, string value, string message)
    {
        var result = await Plumb.RunAsync("sweep", Sample("claims.jsonl"), "--model", "recording:" + Sample("recording.jsonl"), option, value);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: " + message, Assert.Single(result.ErrorLines), StringComparison.Ordinal);
    }
}
