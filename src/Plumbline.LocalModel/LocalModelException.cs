namespace Plumbline.LocalModel;

/// <summary>
/// A local model folder cannot be used: no model, not a decoder-only model, no tokenizer, too large for
/// the memory available, or the runtime refused it. Found when the folder is opened, before any claim is
/// spent. The message is one line that names the folder and what is missing.
/// </summary>
public sealed class LocalModelException : Exception
{
    public LocalModelException(string directory, string problem, Exception? inner = null)
        : base($"'{directory}': {problem}", inner)
    {
        Directory = directory;
        Problem = problem;
    }

    /// <summary>The model folder as the user named it.</summary>
    public string Directory { get; }

    /// <summary>What is wrong, without the folder's name.</summary>
    public string Problem { get; }
}
