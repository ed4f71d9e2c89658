namespace Plumbline.Models.Recording;

/// <summary>
/// A recording file line that cannot be used. The message is one line,
/// "<c>file:line: field: problem</c>", so the command line can print it as it is.
/// </summary>
public sealed class RecordingFormatException : Exception
{
    public RecordingFormatException(string file, int line, string? field, string problem)
        : base(field is null ? $"{file}:{line}: {problem}" : $"{file}:{line}: {field}: {problem}")
    {
        File = file;
        Line = line;
        Field = field;
        Problem = problem;
    }

    public string File { get; }

    /// <summary>1-based line number in the file.</summary>
    public int Line { get; }

    /// <summary>Dotted path of the offending field ("response.p_true"); null when the line as a whole is wrong.</summary>
    public string? Field { get; }

    public string Problem { get; }
}
