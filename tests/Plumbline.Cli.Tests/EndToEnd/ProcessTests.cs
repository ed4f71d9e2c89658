using System.Text.Json;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>Behaviour that only a real process shows: exit codes as the shell sees them, and Ctrl+C.</summary>
public sealed class ProcessTests
{
    [Fact]
    public async Task Process_EmptyClaim_ExitsTwoWithOneLineOnStandardError()
    {
        var result = await PlumbProcess.RunAsync(SampleSweep.RepositoryRoot, "check", "", "--model", "recording:x.jsonl");

        Assert.Equal(2, result.ExitCode);
        Assert.Equal("plumb: claim c1 (argument 1): empty; give the statement to judge", Assert.Single(result.ErrorLines));
        Assert.Empty(result.Output);
    }

    [Fact]
    public async Task Process_Interrupted_WritesTheFinishedVerdictsAndExitsThree()
    {
        using var folder = new TempDirectory();
        // The scenario's claims many times over, so that the run is still going when the signal comes.
        var sample = File.ReadAllLines(Path.Combine(SampleSweep.RepositoryRoot, SampleSweep.Scenario, "claims.jsonl"))
            .Where(line => line.Trim().Length > 0)
            .Select(line => JsonDocument.Parse(line).RootElement.GetProperty("claim").GetString()!)
            .ToList();
        var lines = Enumerable.Range(0, 20).SelectMany(round => sample.Select((claim, i) =>
            JsonSerializer.Serialize(new Dictionary<string, string> { ["id"] = $"r{round}-{i}", ["claim"] = claim })));
        var claims = folder.Write("claims.jsonl", string.Join('\n', lines));
        var export = folder.File("wcnf");
        var recording = Path.Combine(SampleSweep.RepositoryRoot, SampleSweep.Scenario, "recording.jsonl");

        using var run = PlumbProcess.Start(SampleSweep.RepositoryRoot, "sweep", claims, "--model", "recording:" + recording, "--format", "json", "--export-wcnf", export, "--quiet");
        // The first exported problem shows that a verdict is finished.
        var waited = TimeSpan.Zero;
        while (!(Directory.Exists(export) && Directory.EnumerateFiles(export).Any()) && waited < TimeSpan.FromMinutes(3))
        {
            await Task.Delay(100);
            waited += TimeSpan.FromMilliseconds(100);
        }

        await run.InterruptAsync();
        var result = await run.WaitAsync(TimeSpan.FromMinutes(2));

        Assert.True(result.ExitCode == 3, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        var ids = ReportJson.Ids(report);
        Assert.InRange(ids.Count, 1, sample.Count * 20 - 1);
        Assert.Equal(ids.Count, report.RootElement.GetProperty("figures").GetProperty("claims").GetInt32());
        Assert.Equal($"plumb: interrupted; {ids.Count} claim(s) finished, {sample.Count * 20 - ids.Count} not judged", Assert.Single(result.ErrorLines));
        Assert.Equal(sample.Count * 20 - ids.Count, report.RootElement.GetProperty("completion").GetProperty("not_judged").GetArrayLength());
    }
}
