using System.Text;
using Plumbline.Application.Running;
using Plumbline.Application.Tests.Doubles;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Runs;
using Plumbline.Reports;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Tests.Running;

public sealed class SpillClaimStoreTests
{
    /// <summary>A verdict with every part a report shows: pairs, values, conflicts, stability, deciding clauses, a gold label and tags.</summary>
    private static Verdict Rich(int i) => ScriptedJudge.Settled(new Claim($"s{i}", $"Statement {i} holds \u2013 \"quoted\".", Gold: i % 2 == 0, Tags: ["x", "y"])) with
    {
        Pairs = [new PairScore(0, 0, new EntailmentScores(0.2, 0.5, 0.3))],
        Conflicts = [new LinkConflict(new Link(0, 0, EntailmentKind.Entailment, 0.6), new Link(0, 0, EntailmentKind.Contradiction, 0.55), Dropped: true)],
        Stability = new SampleAgreement(5, 4, false),
        NormalisedMargin = 0.15,
        PairedDirectAnswer = false,
        CutOffDiscarded = 2,
        FalsifiedWithOtherAnswer = [new FalsifiedClause(0, ClauseOrigin.Belief(0), [1], 0.8)],
    };

    private static async Task<string> JsonOfAsync(IClaimStore store)
    {
        var report = new RunReport(
            RunHeader.Create("0.1.0", RunSettings.From(CoherenceOptions.Default, "m", "n", "s", null), DateTimeOffset.UnixEpoch, PairListing.All),
            DateTimeOffset.UnixEpoch.AddSeconds(1), RunFigures.From([Rich(1), Rich(2)], TimeSpan.FromSeconds(1)), [], RunCompletion.Complete, store);
        using var stream = new MemoryStream();
        await ReportWriterRegistry.Default.Create("json").WriteAsync(report, stream, CancellationToken.None);
        return Encoding.UTF8.GetString(stream.ToArray());
    }

    [Fact]
    public async Task ReadAsync_AfterSpilling_TheSameReportAsFromMemoryTwice()
    {
        using var folder = new TempDirectory();
        await using var spill = SpillClaimStore.Create(folder.Path);
        await using var memory = new MemoryClaimStore();
        foreach (var verdict in new[] { Rich(1), Rich(2) })
        {
            var report = ClaimReportBuilder.From(verdict, PairListing.All);
            await spill.AddAsync(report, CancellationToken.None);
            await memory.AddAsync(report, CancellationToken.None);
        }

        var expected = await JsonOfAsync(memory);

        Assert.Equal(2, spill.Count);
        Assert.Equal(expected, await JsonOfAsync(spill));
        Assert.Equal(expected, await JsonOfAsync(spill));
        Assert.Contains("\"cut_off_discarded\": 2", expected, StringComparison.Ordinal);
    }

    [Fact]
    public async Task DisposeAsync_DeletesTheSpillFile()
    {
        using var folder = new TempDirectory();
        var spill = SpillClaimStore.Create(folder.Path);
        await spill.AddAsync(ClaimReportBuilder.From(Rich(1)), CancellationToken.None);
        Assert.Single(Directory.GetFiles(folder.Path));

        await spill.DisposeAsync();

        Assert.Empty(Directory.GetFiles(folder.Path));
    }
}
