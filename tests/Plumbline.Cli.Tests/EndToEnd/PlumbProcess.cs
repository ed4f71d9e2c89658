using System.Diagnostics;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>Runs the built command line as a separate process: <c>dotnet plumb.dll ...</c> from the test's output folder.</summary>
internal sealed class PlumbProcess : IDisposable
{
    private readonly Process process;
    private readonly Task<string> output;
    private readonly Task<string> error;

    private PlumbProcess(Process process, bool readOutput = true)
    {
        this.process = process;
        output = readOutput ? process.StandardOutput.ReadToEndAsync() : Task.FromResult(string.Empty);
        error = process.StandardError.ReadToEndAsync();
    }

    /// <summary>plumb.dll as the build copies it beside the test assembly, with its runtimeconfig.</summary>
    public static string PlumbDll { get; } = Path.Combine(AppContext.BaseDirectory, "plumb.dll");

    public int Id => process.Id;

    public static string Dotnet => Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") ?? "dotnet";

    public static PlumbProcess Start(string workingDirectory, params string[] args) => Start(workingDirectory, [], readOutput: true, null, args);

    /// <summary>Starts plumb with extra environment variables (added to, or replacing, the test process's own).</summary>
    public static PlumbProcess Start(string workingDirectory, IReadOnlyDictionary<string, string>? environment, params string[] args) =>
        Start(workingDirectory, [], readOutput: true, environment, args);

    public static PlumbProcess Start(string workingDirectory, IReadOnlyList<string> launcher, bool readOutput, params string[] args) =>
        Start(workingDirectory, launcher, readOutput, null, args);

    /// <summary>Starts plumb behind <paramref name="launcher"/> (a command and its arguments that run the rest, or none);
    /// with <paramref name="readOutput"/> false the test reads standard output itself.</summary>
    public static PlumbProcess Start(string workingDirectory, IReadOnlyList<string> launcher, bool readOutput, IReadOnlyDictionary<string, string>? environment, params string[] args)
    {
        var start = new ProcessStartInfo(launcher.Count > 0 ? launcher[0] : Dotnet)
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = true,
            UseShellExecute = false,
        };
        foreach (var (name, value) in environment ?? new Dictionary<string, string>())
        {
            start.Environment[name] = value;
        }

        foreach (var part in launcher.Skip(1).Append(Dotnet).Skip(launcher.Count > 0 ? 0 : 1))
        {
            start.ArgumentList.Add(part);
        }

        start.ArgumentList.Add(PlumbDll);
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        return new PlumbProcess(Process.Start(start) ?? throw new InvalidOperationException("dotnet did not start"), readOutput);
    }

    public static async Task<PlumbResult> RunAsync(string workingDirectory, params string[] args)
    {
        using var run = Start(workingDirectory, args);
        return await run.WaitAsync(TimeSpan.FromMinutes(5));
    }

    public async Task<PlumbResult> WaitAsync(TimeSpan limit)
    {
        using var timeout = new CancellationTokenSource(limit);
        try
        {
            await process.WaitForExitAsync(timeout.Token);
        }
        catch (OperationCanceledException)
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"plumb did not finish within {limit}");
        }

        return new PlumbResult(process.ExitCode, await output, await error);
    }

    /// <summary>The next line of standard output (when the test reads it itself).</summary>
    public Task<string?> ReadLineAsync() => process.StandardOutput.ReadLineAsync();

    /// <summary>Closes the read end of standard output, as a program at the end of a pipe does when it has read enough.</summary>
    public void CloseOutput() => process.StandardOutput.Dispose();

    /// <summary>Sends SIGINT, as Ctrl+C in a terminal does.</summary>
    public async Task InterruptAsync()
    {
        using var kill = Process.Start("kill", ["-INT", process.Id.ToString(System.Globalization.CultureInfo.InvariantCulture)]);
        await kill.WaitForExitAsync();
    }

    /// <summary>Ends the process at once (SIGKILL), as a crash or an out-of-memory kill would.</summary>
    public void Kill()
    {
        process.Kill(entireProcessTree: true);
        process.WaitForExit();
    }

    public void Dispose()
    {
        if (!process.HasExited)
        {
            process.Kill(entireProcessTree: true);
        }

        process.Dispose();
    }
}
