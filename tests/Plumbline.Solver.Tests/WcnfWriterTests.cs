using Plumbline.Core.MaxSat;
using Plumbline.Solver.Wcnf;
using Xunit;

namespace Plumbline.Solver.Tests;

public sealed class WcnfWriterTests
{
    private readonly CpSatMaxSatSolver solver = new();

    private static string WriteToString(MaxSatProblem problem, params string[] comments)
    {
        using var text = new StringWriter();
        WcnfWriter.Write(problem, comments, text);
        return text.ToString();
    }

    private static WcnfInstance RoundTrip(MaxSatProblem problem, params string[] comments) =>
        WcnfReader.Read(new StringReader(WriteToString(problem, comments)), "round-trip.wcnf");

    [Fact]
    public void Write_Problem_UsesHardMarkerAndNoHeader()
    {
        var problem = new MaxSatProblem(3, [WeightedClause.Hard(1, -2), WeightedClause.Soft(12, 3), WeightedClause.Hard()]);

        var text = WriteToString(problem, "variable 1: the sky is blue", "");

        Assert.Equal("c variable 1: the sky is blue\nc\nh 1 -2 0\n12 3 0\nh 0\n", text);
    }

    [Fact]
    public void Write_CommentsWithLineBreaks_StayOneCommentLineEach()
    {
        var problem = new MaxSatProblem(2, [WeightedClause.Hard(1, 2), WeightedClause.Soft(3, -1)]);
        string[] comments = ["1: first\nline", "2: \"quoted\"\r\nh 1 0", "3: p wcnf 9 9 9\r", "4: a\u2028b\u0085c\vd\fe\u2029"];

        var instance = RoundTrip(problem, comments);

        Assert.Equal(
            ["1: first line", "2: \"quoted\" h 1 0", "3: p wcnf 9 9 9", "4: a b c d e"],
            instance.Comments);
        Assert.Equal(problem.Clauses.Select(Describe), instance.Problem.Clauses.Select(Describe));
    }

    [Fact]
    public void Write_ZeroWeightSoftClause_IsLeftOut()
    {
        var problem = new MaxSatProblem(1, [WeightedClause.Soft(0, 1), WeightedClause.Soft(2, -1)]);

        Assert.Equal("2 -1 0\n", WriteToString(problem));
    }

    [Fact]
    public void Write_MalformedProblem_ArgumentError()
    {
        var problem = new MaxSatProblem(1, [WeightedClause.Soft(2, 2)]);

        Assert.Throws<ArgumentException>(() => WriteToString(problem));
    }

    [Theory]
    [InlineData(7)]
    [InlineData(77)]
    [InlineData(777)]
    public async Task WriteThenRead_RandomProblem_SameClausesAndOptimum(int seed)
    {
        var problem = RandomProblems.Create(seed);

        var instance = RoundTrip(problem, $"seed {seed}");
        var before = await solver.SolveAsync(problem, CancellationToken.None);
        var after = await solver.SolveAsync(instance.Problem, CancellationToken.None);

        Assert.Equal(
            problem.Clauses.Where(c => c.IsHard || c.Weight > 0).Select(Describe),
            instance.Problem.Clauses.Select(Describe));
        Assert.Equal((before.Status, before.Cost), (after.Status, after.Cost));
    }

    /// <summary>Pre-2022 files (optimum from data/wcnf/expected.tsv, sources in SOURCES.md) rewritten in the 2022 form.</summary>
    [Theory]
    [InlineData("old-format/54.wcsp.log.wcnf", 37)]
    [InlineData("old-format/normalized-factor-size=9-P=13-Q=179.opb.wcnf", 13)]
    [InlineData("old-format/ram_k3_n6.ra1.wcnf", 0)]
    [InlineData("new-format/auctions_wt-cat_sched_60_70_0003.txt.wcnf", 61169)]
    public async Task WriteFileAsync_PublishedInstance_ReadsBackToSameOptimum(string file, long optimum)
    {
        var original = await WcnfReader.ReadFileAsync(TestData.Wcnf(file), CancellationToken.None);
        using var written = new TempFile();

        await WcnfWriter.WriteFileAsync(written.Path, original.Problem, original.Comments, CancellationToken.None);
        var copy = await WcnfReader.ReadFileAsync(written.Path, CancellationToken.None);
        var solution = await solver.SolveAsync(copy.Problem, CancellationToken.None);

        Assert.Equal(WcnfFormat.Since2022, copy.Format);
        Assert.Equal(original.Comments, copy.Comments);
        Assert.Equal((original.HardClauseCount, original.SoftClauseCount), (copy.HardClauseCount, copy.SoftClauseCount));
        Assert.Equal((SolveStatus.Optimal, optimum), (solution.Status, solution.Cost));
    }

    private static string Describe(WeightedClause clause) =>
        $"{(clause.IsHard ? "h" : clause.Weight)}:{string.Join(',', clause.Literals)}";
}
