namespace Plumbline.Cli.Tests;

/// <summary>Runs the command line in-process with captured output and error.</summary>
internal static class Plumb
{
    public static Task<PlumbResult> RunAsync(params string[] args) => RunAsync(args, CancellationToken.None);

    public static async Task<PlumbResult> RunAsync(string[] args, CancellationToken cancellationToken)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        var code = await PlumbCli.RunAsync(args, new CliContext(output, error), cancellationToken);
        return new PlumbResult(code, output.ToString(), error.ToString());
    }
}

public sealed record PlumbResult(int ExitCode, string Output, string Error)
{
    /// <summary>The non-empty lines of standard error.</summary>
    public IReadOnlyList<string> ErrorLines => Error.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);

    public override string ToString() => $"exit {ExitCode}\n--- stdout\n{Output}\n--- stderr\n{Error}";
}
