namespace Plumbline.Solver.Tests;

/// <summary>Locates the instances copied beside the test assembly (see data/wcnf/SOURCES.md for origin and licences).</summary>
internal static class TestData
{
    public static string WcnfDirectory { get; } = Path.Combine(AppContext.BaseDirectory, "data", "wcnf");

    public static string Wcnf(string relativePath) => Path.Combine(WcnfDirectory, relativePath);

    /// <summary>Rows of data/wcnf/expected.tsv, the manifest of instances with known optimum.</summary>
    public static IReadOnlyList<ExpectedOptimum> ExpectedOptima() =>
        File.ReadAllLines(Wcnf("expected.tsv"))
            .Skip(1)
            .Where(line => line.Length > 0)
            .Select(ExpectedOptimum.Parse)
            .ToArray();
}

/// <summary>One manifest row: the file, its optimum, and where the optimum is published.</summary>
internal sealed record ExpectedOptimum(string File, long Cost, string SourceRepo, string SourcePath, string ValueFrom)
{
    public static ExpectedOptimum Parse(string line)
    {
        var fields = line.Split('\t');
        return new ExpectedOptimum(
            fields[0],
            long.Parse(fields[2], System.Globalization.CultureInfo.InvariantCulture),
            fields[3],
            fields[4],
            fields[7]);
    }
}
