using Plumbline.Application.Sinks;

namespace Plumbline.Cli;

/// <summary>How an error reaches standard error: one line, prefixed with the command's name.</summary>
internal static class CliErrors
{
    public const string Prefix = DiagnosticText.Prefix;

    /// <summary>The message on one line (line breaks become spaces), prefixed.</summary>
    public static string Line(string message) => DiagnosticText.Line(message);
}
