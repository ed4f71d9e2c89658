using System.Diagnostics;
using System.Runtime.InteropServices;
using System.Text.Json;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>
/// The command line as users install it: <c>dotnet pack</c> makes the .NET tool (for this machine's platform only, to
/// keep the test quick), <c>dotnet tool install</c> puts it in a temporary tool path from a local folder, and the
/// installed <c>plumb</c> judges the demo with the NLI model that travelled inside the package.
/// </summary>
public sealed class ToolPackageTests
{
#if DEBUG
    private const string Configuration = "Debug";
#else
    private const string Configuration = "Release";
#endif

    [Fact]
    public async Task PackedTool_InstalledFromALocalFolder_RunsTheDemo()
    {
        using var folder = new TempDirectory();
        var root = SampleSweep.RepositoryRoot;
        var packages = Directory.CreateDirectory(folder.File("packages")).FullName;
        var platform = RuntimeInformation.RuntimeIdentifier;

        var pack = await RunAsync(root, null, PlumbProcess.Dotnet, "pack", Path.Combine(root, "src", "Plumbline.Cli"), "-c", Configuration,
            "-o", packages, $"-p:ToolPackageRuntimeIdentifiers={platform}", "--nologo", "--disable-build-servers", "-nodeReuse:false");
        Assert.True(pack.ExitCode == 0, pack.ToString());
        Assert.Equal(["Plumbline.Cli.0.1.0.nupkg", $"Plumbline.Cli.{platform}.0.1.0.nupkg"], Directory.GetFiles(packages).Select(Path.GetFileName).Order(StringComparer.Ordinal));

        // Only the local folder as a source, and a fresh package folder, so no copy cached earlier can stand in for this one.
        var config = folder.Write("nuget.config",
            $"<?xml version=\"1.0\" encoding=\"utf-8\"?>\n<configuration>\n  <packageSources>\n    <clear />\n    <add key=\"local\" value=\"{packages}\" />\n  </packageSources>\n</configuration>\n");
        var tools = folder.File("tools");
        var install = await RunAsync(folder.Path, new Dictionary<string, string> { ["NUGET_PACKAGES"] = folder.File("nuget-cache") },
            PlumbProcess.Dotnet, "tool", "install", "Plumbline.Cli", "--tool-path", tools, "--configfile", config);
        Assert.True(install.ExitCode == 0, install.ToString());

        var demo = await RunAsync(root, null, Path.Combine(tools, "plumb"),
            "sweep", $"{SampleSweep.Scenario}/claims.jsonl", "--model", $"recording:{SampleSweep.Scenario}/recording.jsonl", "--format", "json", "--quiet");

        Assert.True(demo.ExitCode == 0, demo.ToString());
        using var report = JsonDocument.Parse(demo.Output);
        Assert.Equal(12, ReportJson.Ids(report).Count);
        Assert.StartsWith("plumbline-nli-minilm-l6-int8", report.RootElement.GetProperty("settings").GetProperty("nli_model").GetString(), StringComparison.Ordinal);
        // Hand-checked in samples/thistlewick/EXPECTED.md: the blender jug claim is overturned to false.
        Assert.Equal("overturned", ReportJson.Status(report, "blender-jug"));
        Assert.False(ReportJson.Claim(report, "blender-jug").GetProperty("answer").GetBoolean());
    }

    private static async Task<PlumbResult> RunAsync(string workingDirectory, IReadOnlyDictionary<string, string>? environment, string program, params string[] args)
    {
        var start = new ProcessStartInfo(program)
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        foreach (var (name, value) in environment ?? new Dictionary<string, string>())
        {
            start.Environment[name] = value;
        }

        using var process = Process.Start(start)!;
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        using var timeout = new CancellationTokenSource(TimeSpan.FromMinutes(8));
        try
        {
            await process.WaitForExitAsync(timeout.Token);
        }
        catch (OperationCanceledException)
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"{program} {string.Join(' ', args)} did not finish within 8 minutes");
        }

        return new PlumbResult(process.ExitCode, await output, await error);
    }
}
