namespace Plumbline.Nli.Tests;

/// <summary>A scratch model directory: links to the repository model's files plus files a test writes itself.</summary>
internal sealed class TempModelDirectory : IDisposable
{
    public TempModelDirectory()
    {
        Path = Directory.CreateTempSubdirectory("plumbline-nli-").FullName;
    }

    public string Path { get; }

    public string File(string name) => System.IO.Path.Combine(Path, name);

    /// <summary>Links a file of the repository model (linking spares copying the 20+ MB model per test).</summary>
    public TempModelDirectory Link(string name)
    {
        System.IO.File.CreateSymbolicLink(File(name), RepositoryModel.File(name));
        return this;
    }

    /// <summary>Copies every file of another directory (not its subfolders).</summary>
    public TempModelDirectory CopyFrom(string directory)
    {
        foreach (var file in Directory.GetFiles(directory))
        {
            System.IO.File.Copy(file, File(System.IO.Path.GetFileName(file)));
        }

        return this;
    }

    public TempModelDirectory Write(string name, string text)
    {
        System.IO.File.WriteAllText(File(name), text);
        return this;
    }

    public TempModelDirectory Write(string name, byte[] bytes)
    {
        System.IO.File.WriteAllBytes(File(name), bytes);
        return this;
    }

    public void Dispose() => Directory.Delete(Path, recursive: true);
}
