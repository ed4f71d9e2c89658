namespace Plumbline.Cli;

/// <summary>Where a command writes: results to <see cref="Output"/>, one-line errors to <see cref="Error"/>.</summary>
/// <param name="Output">Standard output, or a test's writer.</param>
/// <param name="Error">Standard error, or a test's writer.</param>
/// <param name="ColourTerminal">Output is a terminal that wants colour.</param>
internal sealed record CliContext(TextWriter Output, TextWriter Error, bool ColourTerminal = false)
{
    /// <summary>The process's own console; colour only when standard output is a terminal and NO_COLOR is unset.</summary>
    public static CliContext ForConsole() => new(
        Console.Out,
        Console.Error,
        !Console.IsOutputRedirected && string.IsNullOrEmpty(Environment.GetEnvironmentVariable("NO_COLOR")));
}
