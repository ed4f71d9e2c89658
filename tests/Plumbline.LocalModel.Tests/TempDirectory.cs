namespace Plumbline.LocalModel.Tests;

/// <summary>A fresh folder under the system temp folder, deleted on dispose.</summary>
internal sealed class TempDirectory : IDisposable
{
    public TempDirectory()
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "plumb-local-tests-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    public string File(string name) => System.IO.Path.Combine(Path, name);

    /// <summary>A copy of the tiny model folder (without its reference files) to break on purpose.</summary>
    public static TempDirectory WithTinyModel()
    {
        var copy = new TempDirectory();
        foreach (var file in Directory.EnumerateFiles(TinyModel.Directory))
        {
            System.IO.File.Copy(file, copy.File(System.IO.Path.GetFileName(file)));
        }

        return copy;
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Path, recursive: true);
        }
        catch (IOException)
        {
            // A leftover temp folder is harmless; a failing dispose would hide the test's own result.
        }
    }
}
