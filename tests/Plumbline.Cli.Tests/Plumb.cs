using System.Text;
using Plumbline.Cli.Composition;

namespace Plumbline.Cli.Tests;

/// <summary>Runs the command line in-process with captured output and error.</summary>
internal static class Plumb
{
    public static Task<PlumbResult> RunAsync(params string[] args) => RunWithInputAsync(CompositionRoot.Default, null, args);

    public static Task<PlumbResult> RunAsync(CompositionRoot root, params string[] args) => RunWithInputAsync(root, null, args);

    /// <summary>Runs with <paramref name="workingDirectory"/> as the folder a config file is looked for in.</summary>
    public static async Task<PlumbResult> RunInAsync(CompositionRoot root, string workingDirectory, params string[] args)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        var context = new CliContext(output, error) { WorkingDirectory = () => workingDirectory };
        var code = await PlumbCli.RunAsync(args, context, root, CancellationToken.None);
        return new PlumbResult(code, output.ToString(), error.ToString());
    }

    /// <summary>Runs with <paramref name="standardInput"/> as the text on standard input.</summary>
    public static async Task<PlumbResult> RunWithInputAsync(CompositionRoot root, string? standardInput, params string[] args)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        var context = new CliContext(output, error)
        {
            StandardInput = () => new MemoryStream(Encoding.UTF8.GetBytes(standardInput ?? string.Empty)),
        };
        var code = await PlumbCli.RunAsync(args, context, root, CancellationToken.None);
        return new PlumbResult(code, output.ToString(), error.ToString());
    }
}

public sealed record PlumbResult(int ExitCode, string Output, string Error)
{
    /// <summary>The non-empty lines of standard error.</summary>
    public IReadOnlyList<string> ErrorLines => Error.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);

    public override string ToString() => $"exit {ExitCode}\n--- stdout\n{Output}\n--- stderr\n{Error}";
}
