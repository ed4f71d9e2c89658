using Plumbline.Application.Sinks;

namespace Plumbline.Application.Tests.Sinks;

public sealed class WcnfExportSinkTests
{
    [Theory]
    [InlineData("c1", "c1")]
    [InlineData("a/b", "a_b")]
    [InlineData("..", "_..")]
    [InlineData("", "_")]
    [InlineData("é x", "__x")]
    public void UniqueName_UnsafeCharacters_BecomeUnderscores(string id, string expected)
    {
        using var folder = new TempDirectory();
        var export = WcnfExportSink.Open(folder.Path);

        Assert.Equal(expected, export.UniqueName(id));
    }

    [Fact]
    public void UniqueName_TwoIdsWithTheSameFileName_GetDistinctNames()
    {
        using var folder = new TempDirectory();
        var export = WcnfExportSink.Open(folder.Path);

        Assert.Equal(["a_b", "a_b-2", "a_b-3"], new[] { export.UniqueName("a/b"), export.UniqueName("a_b"), export.UniqueName("a:b") });
    }

    [Fact]
    public void Open_FolderUnderAFile_UsageErrorBeforeTheRun()
    {
        using var folder = new TempDirectory();
        var file = folder.Write("taken", "a file, not a folder");

        var error = Assert.Throws<UsageException>(() => WcnfExportSink.Open(Path.Combine(file, "wcnf")));

        Assert.StartsWith("--export-wcnf: cannot create folder ", error.Message, StringComparison.Ordinal);
    }
}
