namespace Plumbline.Cli;

/// <summary>How an error reaches standard error: one line, prefixed with the command's name.</summary>
internal static class CliErrors
{
    public const string Prefix = "plumb: ";

    /// <summary>The message on one line (line breaks become spaces), prefixed.</summary>
    public static string Line(string message)
    {
        var oneLine = string.Join(' ', message.Split(['\r', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));
        return Prefix + oneLine;
    }
}
