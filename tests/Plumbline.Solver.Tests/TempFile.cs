namespace Plumbline.Solver.Tests;

/// <summary>A uniquely named file in the temp folder, deleted on dispose.</summary>
internal sealed class TempFile : IDisposable
{
    public string Path { get; } =
        System.IO.Path.Combine(System.IO.Path.GetTempPath(), $"plumbline-solver-{Guid.NewGuid():N}.wcnf");

    public static async Task<TempFile> WithTextAsync(string text)
    {
        var file = new TempFile();
        await File.WriteAllTextAsync(file.Path, text);
        return file;
    }

    public void Dispose() => File.Delete(Path);
}
