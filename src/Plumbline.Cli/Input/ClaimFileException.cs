namespace Plumbline.Cli.Input;

/// <summary>
/// A claim file line that cannot be used. The message is one line, <c>file:line: field: problem</c>
/// (or <c>file:line: problem</c> when the line as a whole is wrong), ready to print as it is.
/// </summary>
public sealed class ClaimFileException : Exception
{
    public ClaimFileException(string file, int line, string? field, string problem)
        : base(field is null ? $"{file}:{line}: {problem}" : $"{file}:{line}: {field}: {problem}")
    {
        File = file;
        Line = line;
        Field = field;
        Problem = problem;
    }

    public string File { get; }

    /// <summary>1-based line number; 0 when the file as a whole is wrong (e.g. it holds no claim).</summary>
    public int Line { get; }

    /// <summary>The offending field ("claim", "gold", ...); null when the line as a whole is wrong.</summary>
    public string? Field { get; }

    public string Problem { get; }
}
