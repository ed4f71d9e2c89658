namespace Plumbline.Models.Tests.Recording;

/// <summary>A fresh directory under the system temp folder, removed when the test ends.</summary>
internal sealed class TempDirectory : IDisposable
{
    public TempDirectory()
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "plumbline-tests-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    public string File(string name) => System.IO.Path.Combine(Path, name);

    /// <summary>Writes <paramref name="lines"/> joined by "\n" (with a final newline) and returns the path.</summary>
    public string Write(string name, params string[] lines)
    {
        var path = File(name);
        System.IO.File.WriteAllText(path, string.Join('\n', lines) + "\n");
        return path;
    }

    public void Dispose() => Directory.Delete(Path, recursive: true);
}
