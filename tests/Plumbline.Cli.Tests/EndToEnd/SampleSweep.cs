using Plumbline.Reports.Tests.Schema;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>One run of the demo scenario through the built command line, shared by the tests that read it.</summary>
public sealed class SampleSweep : IAsyncLifetime
{
    public const string Scenario = "samples/thistlewick";

    public PlumbResult Result { get; private set; } = new(-1, "", "");

    public static string RepositoryRoot => ReportSchemaFile.RepositoryRoot();

    public async Task InitializeAsync() =>
        Result = await PlumbProcess.RunAsync(
            RepositoryRoot,
            "sweep", $"{Scenario}/claims.jsonl", "--model", $"recording:{Scenario}/recording.jsonl", "--format", "json", "--quiet");

    public Task DisposeAsync() => Task.CompletedTask;
}
