namespace Plumbline.Benchmarks;

/// <summary>Where the repository's own files are, from the working directory upwards.</summary>
internal static class RepositoryPaths
{
    /// <summary>The folder holding Plumbline.slnx, or the working directory when none is found.</summary>
    public static string Root()
    {
        for (var folder = new DirectoryInfo(Environment.CurrentDirectory); folder is not null; folder = folder.Parent)
        {
            if (File.Exists(Path.Combine(folder.FullName, "Plumbline.slnx")))
            {
                return folder.FullName;
            }
        }

        return Environment.CurrentDirectory;
    }

    /// <summary>The shipped NLI model's folder.</summary>
    public static string ShippedNliModel() => Path.Combine(Root(), "models", "nli-minilm-int8");
}
