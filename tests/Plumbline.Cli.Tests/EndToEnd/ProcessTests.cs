using System.Text.Json;
using Plumbline.Cli.Tests.Doubles;

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

    /// <summary>The scenario's claims <paramref name="rounds"/> times over, with distinct ids, as a claim file.</summary>
    private static string RepeatedSample(TempDirectory folder, int rounds)
    {
        var sample = File.ReadAllLines(Path.Combine(SampleSweep.RepositoryRoot, SampleSweep.Scenario, "claims.jsonl"))
            .Where(line => line.Trim().Length > 0)
            .Select(line => JsonDocument.Parse(line).RootElement.GetProperty("claim").GetString()!)
            .ToList();
        var lines = Enumerable.Range(0, rounds).SelectMany(round => sample.Select((claim, i) =>
            JsonSerializer.Serialize(new Dictionary<string, string> { ["id"] = $"r{round}-{i}", ["claim"] = claim })));
        return folder.Write("claims.jsonl", string.Join('\n', lines));
    }

    private static string Recording => "recording:" + Path.Combine(SampleSweep.RepositoryRoot, SampleSweep.Scenario, "recording.jsonl");

    [Fact]
    public async Task Process_StandardOutputClosedByItsReader_EndsQuietlyWithoutJudgingTheRest()
    {
        using var folder = new TempDirectory();
        var claims = RepeatedSample(folder, rounds: 20);
        using var run = PlumbProcess.Start(SampleSweep.RepositoryRoot, [], readOutput: false, "sweep", claims, "--model", Recording, "--format", "jsonl", "--in-flight", "1", "--quiet");

        Assert.StartsWith("{\"record\":\"run\"", await run.ReadLineAsync());
        Assert.StartsWith("{\"record\":\"claim\"", await run.ReadLineAsync());
        run.CloseOutput();
        var result = await run.WaitAsync(TimeSpan.FromMinutes(3));

        Assert.True(result.ExitCode == 3, result.ToString());
        Assert.Empty(result.Error);
    }

    [Fact]
    [System.Runtime.Versioning.UnsupportedOSPlatform("windows")]
    public async Task Process_WcnfExportToAReadOnlyFolder_ReportStillCompleteAndExitThree()
    {
        using var folder = new TempDirectory();
        var export = Directory.CreateDirectory(folder.File("read-only")).FullName;
        File.SetUnixFileMode(export, UnixFileMode.UserRead | UnixFileMode.UserExecute | UnixFileMode.GroupRead | UnixFileMode.GroupExecute | UnixFileMode.OtherRead | UnixFileMode.OtherExecute);
        // Root may write anywhere; without the capability to override file modes it honours them like anyone.
        string[] launcher = Environment.UserName == "root" ? ["setpriv", "--bounding-set", "-dac_override,-dac_read_search", "--"] : [];

        using var run = PlumbProcess.Start(SampleSweep.RepositoryRoot, launcher, readOutput: true,
            "sweep", $"{SampleSweep.Scenario}/claims.jsonl", "--model", Recording, "--format", "json", "--export-wcnf", export, "--quiet");
        var result = await run.WaitAsync(TimeSpan.FromMinutes(3));

        Assert.True(result.ExitCode == 3, result.ToString());
        Assert.Empty(Directory.GetFiles(export));
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(SampleSweepTests.ExpectedVerdicts.Select(r => (string)r[0]), ReportJson.Ids(report));
        var problem = Assert.Single(report.RootElement.GetProperty("completion").GetProperty("problems").EnumerateArray());
        Assert.StartsWith($"wcnf export to {export} failed: ", problem.GetProperty("message").GetString(), StringComparison.Ordinal);
        Assert.StartsWith($"plumb: wcnf export to {export} failed: ", Assert.Single(result.ErrorLines), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public async Task Process_TextOnATerminal_ColouredUnlessNoColorIsSet(bool noColor)
    {
        using var folder = new TempDirectory();
        var recording = await Recordings.WriteAsync(folder.File("rec.jsonl"), (TestClaims.Bats, 0.9));
        // script(1) gives the command a terminal as standard output, as an interactive shell would.
        var command = $"{(noColor ? "NO_COLOR=1 " : "")}'{PlumbProcess.Dotnet}' '{PlumbProcess.PlumbDll}' check '{TestClaims.Bats}' --model 'recording:{recording}' --quiet";

        var start = new System.Diagnostics.ProcessStartInfo("script") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var arg in new[] { "-qec", command, "/dev/null" })
        {
            start.ArgumentList.Add(arg);
        }

        using var process = System.Diagnostics.Process.Start(start)!;
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        await process.WaitForExitAsync().WaitAsync(TimeSpan.FromMinutes(2));
        var result = new PlumbResult(process.ExitCode, await output, await error);

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Contains(TestClaims.Bats, result.Output, StringComparison.Ordinal);
        Assert.Equal(!noColor, result.Output.Contains("\u001b[1mc1\u001b[0m", StringComparison.Ordinal));
        Assert.Equal(!noColor, result.Output.Contains('\u001b', StringComparison.Ordinal));
    }
}
