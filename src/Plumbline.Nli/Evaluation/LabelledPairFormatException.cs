namespace Plumbline.Nli.Evaluation;

/// <summary>A labelled-pair file with a bad row; the one-line message names file, line and field.</summary>
public sealed class LabelledPairFormatException : Exception
{
    public LabelledPairFormatException(string file, int line, string field, string problem, Exception? inner = null)
        : base($"{file}:{line}: {field}: {problem}", inner)
    {
        File = file;
        Line = line;
        Field = field;
    }

    public string File { get; }

    /// <summary>1-based line where the bad row starts.</summary>
    public int Line { get; }

    public string Field { get; }
}
