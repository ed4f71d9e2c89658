using System.Text.Json;

namespace Plumbline.Cli.Tests.Commands;

public sealed class SolveCommandTests
{
    // Optimum worked out by hand over all four assignments: hard (x1 or x2); soft 3: not x1, 5: not x2, 2: x1.
    // x1=T,x2=F breaks "not x1" (3); x1=F,x2=T breaks 5+2 = 7; both true breaks 3+5 = 8. Optimum 3.
    private const string Tiny2022 = "c tiny\nh 1 2 0\n3 -1 0\n5 -2 0\n2 1 0\n";

    // The same instance with a header; top 11 exceeds the soft total (10), so weight 11 marks the hard clause.
    private const string TinyHeader = "p wcnf 2 4 11\n11 1 2 0\n3 -1 0\n5 -2 0\n2 1 0\n";

    [Theory]
    [InlineData(Tiny2022, "2022")]
    [InlineData(TinyHeader, "p wcnf, top 11")]
    public async Task Solve_TinyInstance_PrintsOptimalStatusAndCost(string text, string format)
    {
        using var folder = new TempDirectory();
        var path = folder.Write("tiny.wcnf", text);

        var result = await Plumb.RunAsync("solve", path);

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Empty(result.Error);
        var rows = result.Output.Split('\n').Select(l => l.Trim()).ToList();
        Assert.Contains("status     optimal", rows);
        Assert.Contains("cost       3", rows);
        Assert.Contains("variables  2", rows);
        Assert.Contains("clauses    1 hard, 3 soft", rows);
        Assert.Contains($"format     {format}", rows);
    }

    [Fact]
    public async Task Solve_JsonFormat_GivesStatusCostAndSizes()
    {
        using var folder = new TempDirectory();
        var path = folder.Write("tiny.wcnf", Tiny2022);

        var result = await Plumb.RunAsync("solve", path, "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var json = JsonDocument.Parse(result.Output);
        var root = json.RootElement;
        Assert.Equal("optimal", root.GetProperty("status").GetString());
        Assert.Equal(3, root.GetProperty("cost").GetInt64());
        Assert.Equal(2, root.GetProperty("variables").GetInt32());
        Assert.Equal(1, root.GetProperty("hard_clauses").GetInt32());
        Assert.Equal(3, root.GetProperty("soft_clauses").GetInt32());
        Assert.Equal(JsonValueKind.Null, root.GetProperty("message").ValueKind);
    }

    [Theory]
    [InlineData("h 1 0\nh -1 0\n3 1 0\n")]
    // Clauses of weight top are hard in the header form (common practice of the format), and these two conflict.
    [InlineData("p wcnf 1 3 10\n10 1 0\n10 -1 0\n2 1 0\n")]
    public async Task Solve_UnsatisfiableHardClauses_ExitsOneWithMessage(string text)
    {
        using var folder = new TempDirectory();
        var path = folder.Write("unsat.wcnf", text);

        var result = await Plumb.RunAsync("solve", path);

        Assert.True(result.ExitCode == 1, result.ToString());
        Assert.Contains("status     unsatisfiable", result.Output);
        Assert.StartsWith($"plumb: {path}: hard clauses are unsatisfiable", Assert.Single(result.ErrorLines));
    }

    [Theory]
    [InlineData("h 1 0\n3 -x 0\n", 2, "literal")]
    [InlineData("p wcnf 2 3\n1 1 0\n", 1, "header nbclauses")]
    [InlineData("h 1 0\n0.5 -1 0\n", 2, "clause weight")]
    public async Task Solve_MalformedFile_ExitsTwoNamingFileLineAndField(string text, int line, string field)
    {
        using var folder = new TempDirectory();
        var path = folder.Write("bad.wcnf", text);

        var result = await Plumb.RunAsync("solve", path);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"plumb: {path}:{line}: {field}: ", Assert.Single(result.ErrorLines));
        Assert.Empty(result.Output);
    }

    [Fact]
    public async Task Solve_MissingFile_ExitsTwo()
    {
        using var folder = new TempDirectory();
        var path = folder.File("absent.wcnf");

        var result = await Plumb.RunAsync("solve", path);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"plumb: {path}: file not found", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Solve_NonPositiveTimeLimit_ExitsTwo()
    {
        var result = await Plumb.RunAsync("solve", "x.wcnf", "--time-limit", "0");

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: --time-limit: '0' is not a positive number of seconds", Assert.Single(result.ErrorLines));
    }
}
