namespace Plumbline.Nli;

/// <summary>
/// An NLI model directory cannot be used: a file is missing, unreadable or inconsistent with the others.
/// The message is one line and names the file; the command line turns it into exit code 2.
/// </summary>
public sealed class NliModelException : Exception
{
    public NliModelException(string filePath, string problem, Exception? inner = null)
        : base($"{filePath}: {problem}", inner)
    {
        FilePath = filePath;
    }

    /// <summary>The file at fault (or the directory, when no file of the expected kind is there).</summary>
    public string FilePath { get; }
}
