using Plumbline.Reports.Tests.Schema;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>
/// One run of the demo scenario through the built command line, shared by the tests that read it: the JSON report on
/// standard output and every other format written to files in one go (<c>--report FORMAT:PATH</c>, repeated).
/// </summary>
public sealed class SampleSweep : IAsyncLifetime
{
    public const string Scenario = "samples/thistlewick";

    private readonly TempDirectory folder = new();

    public PlumbResult Result { get; private set; } = new(-1, "", "");

    public static string RepositoryRoot => ReportSchemaFile.RepositoryRoot();

    /// <summary>The file a format was written to: report.txt, report.md, report.html, report.xml (junit), report.jsonl.</summary>
    public string FileOf(string format) => folder.File("report." + format switch { "text" => "txt", "junit" => "xml", _ => format });

    public async Task InitializeAsync() =>
        Result = await PlumbProcess.RunAsync(
            RepositoryRoot,
            [
                "sweep", $"{Scenario}/claims.jsonl", "--model", $"recording:{Scenario}/recording.jsonl", "--format", "json", "--quiet",
                .. new[] { "text", "md", "html", "junit", "jsonl" }.SelectMany(f => new[] { "--report", $"{f}:{FileOf(f)}" }),
            ]);

    public Task DisposeAsync()
    {
        folder.Dispose();
        return Task.CompletedTask;
    }
}
