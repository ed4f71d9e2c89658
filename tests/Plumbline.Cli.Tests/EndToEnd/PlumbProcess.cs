using System.Diagnostics;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>Runs the built command line as a separate process: <c>dotnet plumb.dll ...</c> from the test's output folder.</summary>
internal sealed class PlumbProcess : IDisposable
{
    private readonly Process process;
    private readonly Task<string> output;
    private readonly Task<string> error;

    private PlumbProcess(Process process)
    {
        this.process = process;
        output = process.StandardOutput.ReadToEndAsync();
        error = process.StandardError.ReadToEndAsync();
    }

    /// <summary>plumb.dll as the build copies it beside the test assembly, with its runtimeconfig.</summary>
    public static string PlumbDll { get; } = Path.Combine(AppContext.BaseDirectory, "plumb.dll");

    public int Id => process.Id;

    public static PlumbProcess Start(string workingDirectory, params string[] args) => Start(workingDirectory, null, args);

    /// <summary>Starts plumb with extra environment variables (added to, or replacing, the test process's own).</summary>
    public static PlumbProcess Start(string workingDirectory, IReadOnlyDictionary<string, string>? environment, params string[] args)
    {
        var start = new ProcessStartInfo(Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") ?? "dotnet")
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

        start.ArgumentList.Add(PlumbDll);
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        return new PlumbProcess(Process.Start(start) ?? throw new InvalidOperationException("dotnet did not start"));
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
