using System.Text.Json;
using Plumbline.Cli.Tests.EndToEnd;

namespace Plumbline.Cli.Tests.Commands;

/// <summary><c>plumb cache</c> on a real cache file: import a recording under a model, inspect, export, prune.</summary>
public sealed class CacheCommandTests
{
    private static readonly string Recording = Path.Combine(SampleSweep.RepositoryRoot, "samples", "thistlewick", "recording.jsonl");

    /// <summary>Distinct requests of each kind in the recording, counted from the file itself.</summary>
    private static (int Generate, int Answer) CountsInRecording()
    {
        var requests = File.ReadLines(Recording)
            .Where(l => !string.IsNullOrWhiteSpace(l))
            .Select(l => JsonDocument.Parse(l).RootElement.GetProperty("request"))
            .DistinctBy(r => r.GetRawText())
            .ToList();
        return (requests.Count(r => r.GetProperty("kind").GetString() == "generate"), requests.Count(r => r.GetProperty("kind").GetString() == "answer"));
    }

    [Fact]
    public async Task ImportInspectExportPrune_WorkOnOneIdentity()
    {
        using var folder = new TempDirectory();
        var cache = folder.File("cache");
        var (generate, answer) = CountsInRecording();

        var import = await Plumb.RunAsync("cache", "import", Recording, "--model", "http://127.0.0.1:9/v1", "--model-name", "nightly", "--cache-dir", cache);
        var inspect = await Plumb.RunAsync("cache", "inspect", "--cache-dir", cache);

        Assert.True(import.ExitCode == 0, import.ToString());
        Assert.Contains($"{generate + answer} answers added", import.Error, StringComparison.Ordinal);
        Assert.True(inspect.ExitCode == 0, inspect.ToString());
        Assert.Contains($"{generate} texts, {answer} answers", inspect.Output, StringComparison.Ordinal);
        Assert.Contains("\"name\":\"nightly\"", inspect.Output, StringComparison.Ordinal);

        // Importing again adds nothing; the export is a recording with every request once.
        var again = await Plumb.RunAsync("cache", "import", Recording, "--model", "http://127.0.0.1:9/v1", "--model-name", "nightly", "--cache-dir", cache);
        Assert.Contains("0 answers added", again.Error, StringComparison.Ordinal);
        var exported = folder.File("exported.jsonl");
        var export = await Plumb.RunAsync("cache", "export", exported, "--cache-dir", cache);
        Assert.True(export.ExitCode == 0, export.ToString());
        Assert.Equal(generate + answer, File.ReadLines(exported).Count());

        var refused = await Plumb.RunAsync("cache", "prune", "--cache-dir", cache);
        Assert.Equal(2, refused.ExitCode);
        var prune = await Plumb.RunAsync("cache", "prune", "--all", "--cache-dir", cache);
        Assert.Contains($"{generate + answer} answers deleted", prune.Error, StringComparison.Ordinal);
        Assert.Contains("0 model identities", (await Plumb.RunAsync("cache", "inspect", "--cache-dir", cache)).Output, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Export_OfAnEmptyCache_SaysSo()
    {
        using var folder = new TempDirectory();

        var result = await Plumb.RunAsync("cache", "export", folder.File("out.jsonl"), "--cache-dir", folder.File("cache"));

        Assert.Equal(2, result.ExitCode);
        Assert.Contains("is empty", Assert.Single(result.ErrorLines), StringComparison.Ordinal);
    }
}
