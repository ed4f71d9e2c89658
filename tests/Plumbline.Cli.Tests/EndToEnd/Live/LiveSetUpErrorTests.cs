using System.Net;
using System.Net.Sockets;
using Plumbline.LoopbackEndpoint;

namespace Plumbline.Cli.Tests.EndToEnd.Live;

/// <summary>Set-up mistakes with a live model: one line saying what to fix, exit 2, nothing spent.</summary>
public sealed class LiveSetUpErrorTests
{
    [Fact]
    public async Task Sweep_NothingListening_ExitsTwoWithOneLine()
    {
        using var run = new LiveRun(2);
        var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        var port = ((IPEndPoint)listener.LocalEndpoint).Port;
        listener.Stop();

        var result = await run.RunAsync(["sweep", run.ClaimFile, "--model", $"http://127.0.0.1:{port}/v1", "--model-name", "m", "--cache-dir", run.CacheDir]);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"plumb: --model: cannot reach http://127.0.0.1:{port}/v1", Assert.Single(result.ErrorLines), StringComparison.Ordinal);
        Assert.Equal("", result.Output);
    }

    [Fact]
    public async Task Sweep_NoKeyWhereOneIsNeeded_ExitsTwoNamingTheVariable()
    {
        using var run = new LiveRun(2);
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(RequiredKey: "secret"));

        var result = await run.RunAsync(run.Sweep(server, run.File("r.json")));

        Assert.Equal(2, result.ExitCode);
        Assert.Contains("wants an API key", Assert.Single(result.ErrorLines), StringComparison.Ordinal);
        Assert.Contains("set PLUMB_API_KEY", result.Error, StringComparison.Ordinal);
        Assert.Equal(1, server.Requests);
    }

    [Fact]
    public async Task Sweep_UnknownModelName_ExitsTwoPointingAtTheName()
    {
        using var run = new LiveRun(2);
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(Models: ["another-model"]));

        var result = await run.RunAsync(run.Sweep(server, run.File("r.json")));

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: --model-name:", Assert.Single(result.ErrorLines), StringComparison.Ordinal);
        Assert.Equal(1, server.Requests);
    }

    [Fact]
    public async Task Sweep_CacheFileThatIsNotACache_ExitsTwoBeforeAnyClaim()
    {
        using var run = new LiveRun(2);
        Directory.CreateDirectory(run.CacheDir);
        await File.WriteAllTextAsync(Path.Combine(run.CacheDir, "responses.sqlite"), "shopping list\n");
        await using var server = await LoopbackModelServer.StartAsync();

        var result = await run.RunAsync(run.Sweep(server, run.File("r.json")));

        Assert.Equal(2, result.ExitCode);
        Assert.Contains("is not a Plumbline response cache", Assert.Single(result.ErrorLines), StringComparison.Ordinal);
        Assert.InRange(server.Requests, 0, 1);
        Assert.False(File.Exists(run.File("r.json")));
    }

    [Fact]
    public async Task Sweep_ServerWithoutLogprobs_SaysBeliefsAreEstimatedAndMarksThem()
    {
        using var run = new LiveRun(2);
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(Logprobs: false));
        var report = run.File("r.json");

        var result = await run.RunAsync(run.Sweep(server, report, more: ["--votes", "4"]));

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Contains(result.ErrorLines, l => l.StartsWith("plumb: note: ", StringComparison.Ordinal) && l.Contains("estimated from 4 sampled answers", StringComparison.Ordinal));
        using var json = System.Text.Json.JsonDocument.Parse(await File.ReadAllTextAsync(report));
        Assert.All(json.RootElement.GetProperty("claims").EnumerateArray(), c => Assert.True(c.GetProperty("probabilities_estimated").GetBoolean()));
    }
}
