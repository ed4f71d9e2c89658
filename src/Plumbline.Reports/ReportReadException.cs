namespace Plumbline.Reports;

/// <summary>A report file that cannot be read back: not a report, another schema version, a field missing or of the wrong type.</summary>
/// <param name="file">The file, as given.</param>
/// <param name="problem">What is wrong, naming the field where there is one.</param>
public sealed class ReportReadException(string file, string problem) : Exception($"{file}: {problem}")
{
    public string File { get; } = file;

    public string Problem { get; } = problem;
}
