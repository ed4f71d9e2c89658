using Plumbline.Core.MaxSat;
using Plumbline.Solver.Wcnf;
using Xunit;

namespace Plumbline.Solver.Tests;

public sealed class WcnfSolvingTests
{
    private readonly CpSatMaxSatSolver solver = new();

    /// <summary>
    /// quirks/frb10-6-{1,2}.wcnf (logic-ng/LogicNG, see data/wcnf/SOURCES.md) declare top = 1, so under the standard
    /// rule every clause is hard; the clause set is then unsatisfiable (CP-SAT INFEASIBLE, per SOURCES.md).
    /// </summary>
    [Theory]
    [InlineData("quirks/frb10-6-1.wcnf", 60, 667)]
    [InlineData("quirks/frb10-6-2.wcnf", 60, 686)]
    public async Task SolveFileAsync_TopOneMakesEveryClauseHard_UnsatisfiableWithTopInMessage(
        string file, int variables, int clauses)
    {
        var summary = await WcnfSolving.SolveFileAsync(TestData.Wcnf(file), solver, CancellationToken.None);

        Assert.Equal(SolveStatus.Unsatisfiable, summary.Status);
        Assert.Equal(1, summary.Top);
        Assert.Equal((variables, clauses, 0), (summary.Variables, summary.HardClauses, summary.SoftClauses));
        Assert.Null(summary.Cost);
        Assert.Empty(summary.Solution.Assignment);
        Assert.Equal(
            "hard clauses are unsatisfiable (header top=1 makes every clause of weight >= 1 hard)",
            summary.Message);
    }

    [Fact]
    public async Task SolveFileAsync_SmallInstance_SummaryCarriesCountsAndOptimum()
    {
        // new-format/small.wcnf (chrjabs/rustsat data/small.wcnf): optimum 5 by exhaustive enumeration, see SOURCES.md.
        var summary = await WcnfSolving.SolveFileAsync(TestData.Wcnf("new-format/small.wcnf"), solver, CancellationToken.None);

        Assert.Equal(SolveStatus.Optimal, summary.Status);
        Assert.Equal(5, summary.Cost);
        Assert.Equal((4, 3, 4), (summary.Variables, summary.HardClauses, summary.SoftClauses));
        Assert.Equal(WcnfFormat.Since2022, summary.Format);
        Assert.Null(summary.Message);
        Assert.True(summary.WallTime > TimeSpan.Zero);
    }

    [Fact]
    public async Task SolveAsync_UnsatisfiableWithoutTop_PlainMessage()
    {
        var instance = WcnfReader.Read(new StringReader("h 1 0\nh -1 0\n3 1 0\n"), "x.wcnf");

        var summary = await WcnfSolving.SolveAsync(instance, solver, CancellationToken.None);

        Assert.Equal(SolveStatus.Unsatisfiable, summary.Status);
        Assert.Equal("hard clauses are unsatisfiable", summary.Message);
    }

    [Theory]
    [InlineData(SolveStatus.Feasible, "optimality not proven before the search stopped; the cost is the best found")]
    [InlineData(SolveStatus.Unknown, "the search stopped before finding any assignment that satisfies the hard clauses")]
    public async Task SolveAsync_IncompleteSearch_ExplainsStatus(SolveStatus status, string message)
    {
        var instance = WcnfReader.Read(new StringReader("h 1 0\n3 -1 0\n"), "x.wcnf");
        var stopped = new FixedSolver(status == SolveStatus.Feasible
            ? new MaxSatSolution(status, 3, [true], [1], TimeSpan.FromSeconds(1))
            : new MaxSatSolution(status, 0, [], [], TimeSpan.FromSeconds(1)));

        var summary = await WcnfSolving.SolveAsync(instance, stopped, CancellationToken.None);

        Assert.Equal(status, summary.Status);
        Assert.Equal(message, summary.Message);
        Assert.Equal(status == SolveStatus.Feasible ? 3 : null, summary.Cost);
    }

    [Fact]
    public async Task SolveFileAsync_MalformedFile_ThrowsFormatErrorBeforeSolving()
    {
        using var bad = await TempFile.WithTextAsync("p wcnf 2 1 4\n4 1 3 0\n");

        var error = await Assert.ThrowsAsync<WcnfFormatException>(
            () => WcnfSolving.SolveFileAsync(bad.Path, solver, CancellationToken.None));

        Assert.Equal((2, "literal"), (error.Line, error.Field));
    }

    /// <summary>Test double standing in for a solver that stopped early (a time limit is not reproducible on demand).</summary>
    private sealed class FixedSolver(MaxSatSolution solution) : IMaxSatSolver
    {
        public string Describe => "fixed";

        public Task<MaxSatSolution> SolveAsync(MaxSatProblem problem, CancellationToken cancellationToken) =>
            Task.FromResult(solution);
    }
}
