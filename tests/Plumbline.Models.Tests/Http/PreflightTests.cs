using System.Net;
using System.Net.Sockets;
using Plumbline.Core.Language.Sources;
using Plumbline.LoopbackEndpoint;
using Xunit;

namespace Plumbline.Models.Tests.Http;

/// <summary>The set-up check turns each common mistake into one line that says what to fix, without the key.</summary>
public sealed class PreflightTests
{
    [Fact]
    public async Task Open_NothingListening_SaysTheEndpointCannotBeReached()
    {
        var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        var port = ((IPEndPoint)listener.LocalEndpoint).Port;
        listener.Stop();

        var error = await Assert.ThrowsAsync<ModelSourceException>(() => Endpoint.OpenAsync($"http://127.0.0.1:{port}/v1"));

        Assert.StartsWith("--model: cannot reach http://127.0.0.1:", error.Message, StringComparison.Ordinal);
        Assert.Contains("ConnectionRefused", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Open_WrongKey_NamesTheVariableButNotTheKey()
    {
        const string wrong = "sk-wrong-4f1c2b9e";
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(RequiredKey: "right"));

        var error = await Assert.ThrowsAsync<ModelSourceException>(() =>
            Endpoint.OpenAsync(server, environment: new Dictionary<string, string> { ["PLUMB_API_KEY"] = wrong }));

        Assert.Contains("refused the API key", error.Message, StringComparison.Ordinal);
        Assert.Contains("PLUMB_API_KEY", error.Message, StringComparison.Ordinal);
        Assert.DoesNotContain(wrong, error.Message, StringComparison.Ordinal);
        Assert.Equal(["Bearer " + wrong], server.Authorizations);
    }

    [Fact]
    public async Task Open_NoKeyWhereOneIsNeeded_SaysWhichVariableToSet()
    {
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(RequiredKey: "right"));

        var error = await Assert.ThrowsAsync<ModelSourceException>(() => Endpoint.OpenAsync(server));

        Assert.Contains("set PLUMB_API_KEY", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Open_UnknownModelName_PointsAtTheModelName()
    {
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(Models: ["served-model"]));

        var error = await Assert.ThrowsAsync<ModelSourceException>(() => Endpoint.OpenAsync(server));

        Assert.StartsWith("--model-name:", error.Message, StringComparison.Ordinal);
        Assert.Contains(Endpoint.Model, error.Message, StringComparison.Ordinal);
        Assert.Equal(1, server.Requests);
    }

    [Fact]
    public async Task Open_ServerBusyAtFirst_GetsAnotherTry()
    {
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions { Faults = FaultPlans.First(1, Fault.Unavailable) });

        var opened = await Endpoint.OpenAsync(server);
        await opened.Model.DisposeAsync();

        Assert.Equal(2, server.Requests);
    }

    [Fact]
    public async Task Open_MissingModelName_AsksForIt()
    {
        var error = await Assert.ThrowsAsync<ModelSourceException>(() =>
            Endpoint.OpenAsync("http://127.0.0.1:9/v1", Endpoint.Options() with { ModelName = "" }));

        Assert.StartsWith("--model-name: required", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Open_ExtraHeaderVariableUnset_SaysWhich()
    {
        var options = Endpoint.Options() with { Headers = [new Plumbline.Models.Http.HeaderFromVariable("X-Org", "PLUMB_TEST_ORG")] };

        var error = await Assert.ThrowsAsync<ModelSourceException>(() => Endpoint.OpenAsync("http://127.0.0.1:9/v1", options));

        Assert.Contains("PLUMB_TEST_ORG is not set", error.Message, StringComparison.Ordinal);
    }
}
