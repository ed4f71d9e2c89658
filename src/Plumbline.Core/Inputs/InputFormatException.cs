namespace Plumbline.Core.Inputs;

/// <summary>
/// A line of an input file that cannot be used. Every reader (claims, recordings, WCNF, labelled pairs)
/// reports through this shape so that the command line prints one line, <c>file:line: field: problem</c>
/// (<c>file:line: problem</c> when the line as a whole is wrong), and exits with a usage error.
/// </summary>
public abstract class InputFormatException : FormatException
{
    protected InputFormatException(string file, int line, string? field, string problem, Exception? inner = null)
        : base(field is null ? $"{file}:{line}: {problem}" : $"{file}:{line}: {field}: {problem}", inner)
    {
        File = file;
        Line = line;
        Field = field;
        Problem = problem;
    }

    public string File { get; }

    /// <summary>1-based line number; 0 when the file as a whole is wrong.</summary>
    public int Line { get; }

    /// <summary>The offending field; null when the line as a whole is wrong.</summary>
    public string? Field { get; }

    /// <summary>What is wrong, without the location.</summary>
    public string Problem { get; }
}
