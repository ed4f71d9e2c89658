namespace Plumbline.Solver.Wcnf;

/// <summary>A WCNF file that cannot be read. <see cref="Exception.Message"/> is one line: <c>file:line: field: problem</c>.</summary>
public sealed class WcnfFormatException : FormatException
{
    public WcnfFormatException(string file, int line, string field, string problem)
        : base($"{file}:{line}: {field}: {problem}")
    {
        File = file;
        Line = line;
        Field = field;
        Problem = problem;
    }

    public string File { get; }

    /// <summary>1-based line number.</summary>
    public int Line { get; }

    /// <summary>The part of the format that is wrong, e.g. <c>clause weight</c>, <c>literal</c>, <c>header top</c>.</summary>
    public string Field { get; }

    /// <summary>What is wrong with the field, without the location.</summary>
    public string Problem { get; }
}
