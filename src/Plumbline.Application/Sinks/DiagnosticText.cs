namespace Plumbline.Application.Sinks;

/// <summary>How a message reaches standard error: one line, prefixed with the command's name.</summary>
public static class DiagnosticText
{
    public const string Prefix = "plumb: ";

    /// <summary>The message on one line (line breaks become spaces), prefixed.</summary>
    public static string Line(string message)
    {
        ArgumentNullException.ThrowIfNull(message);
        var oneLine = string.Join(' ', message.Split(['\r', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));
        return Prefix + oneLine;
    }
}
