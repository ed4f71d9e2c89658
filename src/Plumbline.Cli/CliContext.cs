using Microsoft.Win32.SafeHandles;

namespace Plumbline.Cli;

/// <summary>Where a command reads and writes: standard streams, or a test's writers.</summary>
/// <param name="Output">Standard output as text (results of solve and nli, help).</param>
/// <param name="Error">Standard error: one-line errors, progress, diagnostics.</param>
/// <param name="ColourTerminal">Standard output is a terminal that wants colour.</param>
internal sealed record CliContext(TextWriter Output, TextWriter Error, bool ColourTerminal = false)
{
    /// <summary>Standard output as bytes, for reports; by default the <see cref="Output"/> writer underneath.</summary>
    public Func<Stream> StandardOutput { get; init; } = () => new TextWriterStream(Output);

    /// <summary>Standard input, for claims given as "-".</summary>
    public Func<Stream> StandardInput { get; init; } = () => Stream.Null;

    /// <summary>The folder a config file is looked for in (the process's working directory).</summary>
    public Func<string> WorkingDirectory { get; init; } = () => Environment.CurrentDirectory;

    /// <summary>Standard error is a terminal: progress is drawn as a bar rather than written as lines.</summary>
    public bool ErrorIsTerminal { get; init; }

    /// <summary>
    /// The process's own console; colour only when standard output is a terminal and NO_COLOR is unset. Reports go
    /// to file descriptor 1 directly, because the console's own stream hides a closed pipe, and a run whose reader
    /// went away should stop rather than judge on for nobody.
    /// </summary>
    public static CliContext ForConsole() => new(
        Console.Out,
        Console.Error,
        !Console.IsOutputRedirected && string.IsNullOrEmpty(Environment.GetEnvironmentVariable("NO_COLOR")))
    {
        StandardOutput = () => new FileStream(new SafeFileHandle(1, ownsHandle: false), FileAccess.Write, bufferSize: 0),
        StandardInput = Console.OpenStandardInput,
        ErrorIsTerminal = !Console.IsErrorRedirected,
    };
}
