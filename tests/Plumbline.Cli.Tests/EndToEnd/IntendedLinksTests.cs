using System.Text.Json;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Models.Recording;
using Plumbline.Reports.Tests.Schema;
using Plumbline.Solver;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>
/// The demo's hand-checked verdicts, independent of any NLI model: the engine (default settings, the real
/// solver) over the sample recording, with a scorer that returns exactly the links written down by hand in
/// samples/thistlewick/intended-links.jsonl (the "Links" lines of samples/thistlewick/EXPECTED.md; every other
/// pair neutral). The expected verdicts are EXPECTED.md's summary table, worked out by hand from those links and
/// the recorded beliefs.
/// </summary>
public sealed class IntendedLinksTests
{
    private const string Scenario = "samples/thistlewick";

    /// <summary>
    /// EXPECTED.md, summary table, worked out by hand: direct answer, answer, margin, status, two-sided, optimum
    /// cost, clauses, links, integral and pruned statements, model calls.
    /// </summary>
    private static readonly Dictionary<string, Expected> Summary = new()
    {
        ["kettle-warranty"] = new(true, true, 1.7, ClaimStatus.Settled, false, 0, 6, 4, 3, 0, 11),
        ["toaster-slots"] = new(false, false, 2.3, ClaimStatus.Settled, true, 0, 21, 17, 5, 0, 17),
        ["blender-jug"] = new(true, false, 1.55, ClaimStatus.Overturned, true, 0, 9, 6, 3, 1, 19),
        ["grinder-burrs"] = new(true, true, 0.8, ClaimStatus.Settled, false, 0, 19, 16, 3, 2, 27),
        ["helpline-sundays"] = new(false, false, 0.0, ClaimStatus.Contested, true, 700, 7, 5, 3, 0, 11),
        ["blender-online"] = new(true, false, 1.05, ClaimStatus.Overturned, true, 600, 14, 11, 4, 0, 14),
        ["returns-window"] = new(true, true, 1.6, ClaimStatus.Settled, true, 0, 22, 18, 5, 0, 17),
        ["spare-parts"] = new(false, true, 0.85, ClaimStatus.Overturned, false, 0, 22, 18, 4, 0, 22),
        ["warranty-repairs"] = new(false, false, 1.75, ClaimStatus.Settled, true, 0, 20, 16, 5, 0, 17),
        ["return-receipt"] = new(true, false, 0.1, ClaimStatus.Overturned, true, 600, 7, 5, 3, 0, 11),
        ["head-office"] = new(true, true, 1.65, ClaimStatus.Settled, true, 0, 15, 12, 4, 0, 14),
        ["toaster-warranty"] = new(true, true, 1.35, ClaimStatus.Settled, true, 0, 11, 8, 4, 3, 25),
    };

    public static TheoryData<string> Claims => [.. Summary.Keys];

    /// <summary>
    /// The settings EXPECTED.md's hand derivations assume ("Settings assumed"): the plain method, which the
    /// defaults were until the link floor, the claim's own belief and negations' texts were chosen on the trees
    /// benchmark (docs/engine-settings.md).
    /// </summary>
    private static readonly CoherenceOptions PlainMethod =
        CoherenceOptions.Default with { LinkFloor = 0, ClaimBelief = false, NliText = NliText.Statement };

    [Theory]
    [MemberData(nameof(Claims))]
    public async Task Judge_SampleClaimWithHandWrittenLinks_VerdictAsWorkedOutByHand(string id)
    {
        var expected = Summary[id];

        var (verdict, intended) = await JudgeAsync(id);

        Assert.Null(verdict.Error);
        Assert.Equal(intended.Statements, verdict.Tree!.Statements.Select(s => s.Text));
        Assert.Equal(
            expected,
            new Expected(
                verdict.DirectAnswer!.Value, verdict.Answer!.Value, Math.Round(verdict.Margin, 9), verdict.Status, verdict.TwoSided,
                verdict.ObjectiveCost!.Value, verdict.Problem!.Problem.Clauses.Count, verdict.Links.Count,
                verdict.IntegralCount, verdict.PrunedCount, verdict.ModelCalls));
    }

    [Theory]
    // EXPECTED.md: each of these optima gives up the belief in #1 and nothing else.
    [InlineData("helpline-sundays")]
    [InlineData("blender-online")]
    [InlineData("return-receipt")]
    public async Task Judge_OptimumBreakingOneBelief_FalsifiesExactlyThatBelief(string id)
    {
        var (verdict, _) = await JudgeAsync(id);

        Assert.Equal("belief: #1", Assert.Single(verdict.Falsified).Origin.ToString());
    }

    [Fact]
    public void IntendedLinks_CoverEveryClaimOfTheSampleOnce()
    {
        var ids = File.ReadLines(Path.Combine(Root, Scenario, "claims.jsonl"))
            .Where(line => line.Trim().Length > 0)
            .Select(line => JsonDocument.Parse(line).RootElement.GetProperty("id").GetString());

        Assert.Equal(ids, IntendedLinks().Select(l => l.Id));
        Assert.Equal(ids, Summary.Keys);
    }

    private static string Root => ReportSchemaFile.RepositoryRoot();

    private static async Task<(Verdict Verdict, Intended Intended)> JudgeAsync(string id)
    {
        var intended = IntendedLinks().Single(l => l.Id == id);
        var claimLine = File.ReadLines(Path.Combine(Root, Scenario, "claims.jsonl")).First(line => line.Contains($"\"{id}\"", StringComparison.Ordinal));
        var claim = JsonDocument.Parse(claimLine).RootElement;
        var model = await RecordingLanguageModel.LoadAsync(Path.Combine(Root, Scenario, "recording.jsonl"), PromptBook.PromptVersion, CancellationToken.None);
        var engine = new CoherenceEngine(model, new HandWrittenLinks(intended), new CpSatMaxSatSolver(), PlainMethod, TimeProvider.System);
        var verdict = await engine.JudgeAsync(new Claim(id, claim.GetProperty("claim").GetString()!, claim.GetProperty("gold").GetBoolean()), CancellationToken.None);
        return (verdict, intended);
    }

    private static List<Intended> IntendedLinks() =>
        [.. File.ReadLines(Path.Combine(Root, Scenario, "intended-links.jsonl"))
            .Where(line => line.Trim().Length > 0)
            .Select(line => JsonSerializer.Deserialize<Intended>(line, new JsonSerializerOptions { PropertyNameCaseInsensitive = true })!)];

    private sealed record Expected(
        bool Direct, bool Answer, double Margin, ClaimStatus Status, bool TwoSided, long Cost, int Clauses, int Links, int Integral, int Pruned, int Calls);

    /// <summary>One claim of intended-links.jsonl: statement texts by id, entailments and contradictions (both directions) by id.</summary>
    private sealed record Intended(string Id, string[] Statements, int[][] Entails, int[][] Contradict);

    /// <summary>Scores a pair by the hand-written links of one claim: entailment or contradiction with certainty, else neutral.</summary>
    private sealed class HandWrittenLinks(Intended intended) : IEntailmentScorer
    {
        private static readonly EntailmentScores Entailment = new(1.0, 0.0, 0.0);
        private static readonly EntailmentScores Contradiction = new(0.0, 0.0, 1.0);
        private static readonly EntailmentScores Neutral = new(0.0, 1.0, 0.0);

        public string Describe => "hand-written links";

        public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken)
        {
            var links = new Dictionary<(string, string), EntailmentScores>();
            foreach (var pair in intended.Entails)
            {
                links[(intended.Statements[pair[0]], intended.Statements[pair[1]])] = Entailment;
            }

            foreach (var pair in intended.Contradict)
            {
                links[(intended.Statements[pair[0]], intended.Statements[pair[1]])] = Contradiction;
                links[(intended.Statements[pair[1]], intended.Statements[pair[0]])] = Contradiction;
            }

            IReadOnlyList<EntailmentScores> scores = [.. pairs.Select(p => links.GetValueOrDefault((p.Premise, p.Hypothesis), Neutral))];
            return Task.FromResult(scores);
        }
    }
}
