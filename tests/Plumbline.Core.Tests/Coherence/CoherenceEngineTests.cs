using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.Core.Tests.Doubles;
using Plumbline.Core.Trees;
using static Plumbline.Core.Tests.Coherence.TreeBuilderTests;

namespace Plumbline.Core.Tests.Coherence;

public sealed class CoherenceEngineTests
{
    // The scripted texts ("A", "B") are not sentences; these tests are not about the cut-off rule.
    /// <summary>
    /// The hand-computed examples here assume the plain method: no link floor, no unit clause for the claim's own
    /// belief, every statement scored by its own text (the defaults chosen on the trees benchmark add those).
    /// </summary>
    private static readonly CoherenceOptions PlainMethod =
        CoherenceOptions.Default with { LinkFloor = 0, ClaimBelief = false, NliText = NliText.Statement };

    private static readonly CoherenceOptions OneLevel = PlainMethod with
    {
        Shape = new TreeShape([new LevelShape(1, Decoding.Greedy())]),
        DiscardCutOff = false,
    };

    private static readonly Claim Claim = new("c1", "C");

    /// <summary>
    /// Hand-built example. #1 "A" (for True) is integral/True with belief 0.8 and entails the claim;
    /// #2 "B" (for False) is integral/True with belief 0.9 and contradicts the claim; A contradicts B.
    /// Clauses (weights x1000): x2 800, x3 900, -x2 v x1 1000, -x2 v -x3 1000, -x3 v -x1 1000.
    /// By hand: claim false, A false, B true breaks only "belief: #1" (800); the best with the claim
    /// true is A true, B false, breaking "belief: #2" (900). Answer false, margin (900 - 800) / 1000.
    /// </summary>
    private static (ScriptedModel Model, ScriptedScorer Scorer) Example(double directPTrue)
    {
        var model = new ScriptedModel();
        model.Explanations[("C", true)] = ["A"];
        model.Explanations[("C", false)] = ["B"];
        model.PTrue["C"] = directPTrue;
        model.PTrue["Not: C"] = 0.5;
        model.PTrue["A"] = 0.8;
        model.PTrue["Not: A"] = 0.2;
        model.PTrue["B"] = 0.9;
        model.PTrue["Not: B"] = 0.1;
        var scorer = new ScriptedScorer();
        scorer.Scores[("A", "C")] = ScriptedScorer.Entails(0.9);
        scorer.Scores[("B", "C")] = ScriptedScorer.Contradicts(0.8);
        scorer.Scores[("A", "B")] = ScriptedScorer.Contradicts(0.7);
        return (model, scorer);
    }

    private static CoherenceEngine Engine(ILanguageModel model, IEntailmentScorer scorer, CoherenceOptions? options = null, IMaxSatSolver? solver = null) =>
        new(model, scorer, solver ?? new ExhaustiveSolver(), options ?? OneLevel, TimeProvider.System);

    [Fact]
    public async Task JudgeAsync_HandBuiltExample_AnswerAndMarginAsComputedByHand()
    {
        var (model, scorer) = Example(directPTrue: 0.7);
        var solver = new ExhaustiveSolver();

        var verdict = await Engine(model, scorer, solver: solver).JudgeAsync(Claim, CancellationToken.None);

        Assert.Null(verdict.Error);
        Assert.False(verdict.Answer);
        Assert.True(verdict.DirectAnswer);
        Assert.Equal(0.1, verdict.Margin, 9);
        Assert.Equal(ClaimStatus.Overturned, verdict.Status);
        Assert.True(verdict.Overturned);
        Assert.Equal(800, verdict.ObjectiveCost);
        Assert.Equal(SolveStatus.Optimal, verdict.SolveStatus);
        var falsified = Assert.Single(verdict.Falsified);
        Assert.Equal(("belief: #1", 0.8), (falsified.Origin.ToString(), falsified.Weight));
        Assert.Equal(3, verdict.Links.Count);
        Assert.True(verdict.TwoSided);
        Assert.Equal(3, verdict.IntegralCount);
        Assert.Equal(0, verdict.PrunedCount);
        // Root: negation + 2 answers; level 1: 2 abductions, 2 negations, 4 answers.
        Assert.Equal(11, verdict.ModelCalls);
        Assert.Equal(model.Generations.Count + model.Answers.Count, verdict.ModelCalls);
        var batch = Assert.Single(scorer.Batches);
        Assert.Equal(6, batch.Count);
        // One solve per value of the claim, each pinned by one extra hard unit clause.
        Assert.Equal(
            ["1", "-1"],
            solver.Problems.Select(p => string.Join(' ', Assert.Single(p.Clauses, c => c.IsHard).Literals)));
        Assert.Equal(5, verdict.Problem!.Problem.Clauses.Count);
        Assert.DoesNotContain(verdict.Problem.Problem.Clauses, c => c.IsHard);
    }

    [Fact]
    public async Task JudgeAsync_HandBuiltExample_StatementValuesOfTheOptimum()
    {
        var (model, scorer) = Example(directPTrue: 0.7);

        var verdict = await Engine(model, scorer).JudgeAsync(Claim, CancellationToken.None);

        // The optimum found by hand above: claim false, A false, B true.
        Assert.Equal(new Dictionary<int, bool> { [0] = false, [1] = false, [2] = true }, verdict.Values);
    }

    [Fact]
    public async Task JudgeAsync_HandBuiltExample_NormalisedMarginIsMarginOverTotalClauseWeight()
    {
        var (model, scorer) = Example(directPTrue: 0.7);

        var verdict = await Engine(model, scorer).JudgeAsync(Claim, CancellationToken.None);

        // Total soft weight 800 + 900 + 3 x 1000 = 4700; margin 900 - 800 = 100, so 100 / 4700.
        Assert.Equal(100.0 / 4700, verdict.NormalisedMargin, 12);
        Assert.Equal(0.1, verdict.Margin, 12);
    }

    [Fact]
    public async Task JudgeAsync_PrunedStatement_HasNoValue()
    {
        var (model, scorer) = Example(directPTrue: 0.7);
        model.Explanations[("C", true)] = ["A", "Wobbly"];
        model.PTrue["Wobbly"] = 0.6;
        model.PTrue["Not: Wobbly"] = 0.6;

        var verdict = await Engine(model, scorer, OneLevel with { Shape = new TreeShape([new LevelShape(2, Decoding.Greedy())]) })
            .JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal(["C", "A", "Wobbly", "B"], verdict.Tree!.Statements.Select(s => s.Text));
        Assert.Equal(new Dictionary<int, bool> { [0] = false, [1] = false, [3] = true }, verdict.Values);
    }

    [Theory]
    // p(C) 0.45 and p(not C) 0.3: the plain direct answer is false, the paired one true. The optimum
    // (claim false, as in the example) overturns the paired one and settles the plain one.
    [InlineData(DirectAnswerRule.Plain, ClaimStatus.Settled)]
    [InlineData(DirectAnswerRule.Paired, ClaimStatus.Overturned)]
    public async Task JudgeAsync_DirectAnswerRule_StatusComparesWithTheChosenDirectAnswer(DirectAnswerRule rule, ClaimStatus expected)
    {
        var (model, scorer) = Example(directPTrue: 0.45);
        model.PTrue["Not: C"] = 0.3;

        var verdict = await Engine(model, scorer, OneLevel with { DirectAnswer = rule }).JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal((false, false, true), (verdict.Answer, verdict.DirectAnswer, verdict.PairedDirectAnswer));
        Assert.Equal(expected, verdict.Status);
    }

    /// <summary>
    /// Three sampled trees of the claim "C" (not integral, direct answer false). Samples 0 and 1 explain
    /// True with "A." (believed 0.9, entails C); sample 2 with "B." (believed 0.9, contradicts C).
    /// Each tree alone: A's tree answers true (cost 0 against 900), B's answers false (0 against 900).
    /// </summary>
    private static (ScriptedModel Model, ScriptedScorer Scorer) Sampled(Func<int, string> textOfSample)
    {
        var model = new ScriptedModel
        {
            ExplainWith = r => r.Answer == true ? [textOfSample(r.SampleIndex)] : [],
        };
        model.PTrue["C"] = 0.5;
        model.PTrue["Not: C"] = 0.5;
        foreach (var text in new[] { "A.", "B." })
        {
            model.PTrue[text] = 0.9;
            model.PTrue["Not: " + text] = 0.1;
        }

        var scorer = new ScriptedScorer();
        scorer.Scores[("A.", "C")] = ScriptedScorer.Entails(0.9);
        scorer.Scores[("B.", "C")] = ScriptedScorer.Contradicts(0.9);
        return (model, scorer);
    }

    private static readonly CoherenceOptions SampledLevel = OneLevel with { Shape = new TreeShape([new LevelShape(1, Decoding.Sampling())]) };

    [Fact]
    public async Task JudgeAsync_ThreeSampledTreesTwoAgree_MajorityAnswerAndStabilityTwoThirds()
    {
        var (model, scorer) = Sampled(i => i < 2 ? "A." : "B.");

        var verdict = await Engine(model, scorer, SampledLevel with { Samples = 3 }).JudgeAsync(Claim, CancellationToken.None);

        Assert.True(verdict.Answer);
        Assert.Equal(ClaimStatus.Overturned, verdict.Status);
        Assert.Equal(new SampleAgreement(3, 2, Tied: false), verdict.Stability);
        Assert.Equal(2.0 / 3, verdict.Stability!.Share, 12);
        // The details are those of the first tree giving the majority answer: A's tree.
        Assert.Equal(["C", "A."], verdict.Tree!.Statements.Select(s => s.Text));
        Assert.Equal([0, 1, 2], model.Generations.Where(g => g.Purpose == GenerationPurpose.Abduction && g.Answer == true).Select(g => g.SampleIndex).Order());
        // Each tree: root negation + 2 answers, 2 abductions, then 1 negation + 2 answers for its explanation.
        Assert.Equal(3 * 8, verdict.ModelCalls);
    }

    [Fact]
    public async Task JudgeAsync_TwoSampledTreesDisagree_TieKeepsDirectAnswerAndIsContested()
    {
        var (model, scorer) = Sampled(i => i == 0 ? "A." : "B.");

        var verdict = await Engine(model, scorer, SampledLevel with { Samples = 2 }).JudgeAsync(Claim, CancellationToken.None);

        Assert.False(verdict.Answer);
        Assert.Equal(ClaimStatus.Contested, verdict.Status);
        Assert.Equal(new SampleAgreement(2, 1, Tied: true), verdict.Stability);
    }

    [Fact]
    public async Task JudgeAsync_OneSampledTreeFails_ClaimFailsNamingTheTree()
    {
        var (model, scorer) = Sampled(i => i == 1 ? "Unscripted." : "A.");

        var verdict = await Engine(model, scorer, SampledLevel with { Samples = 3 }).JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal(ClaimStatus.Failed, verdict.Status);
        Assert.EndsWith("(sampled tree 2 of 3)", verdict.Error, StringComparison.Ordinal);
        Assert.Equal(model.Generations.Count + model.Answers.Count, verdict.ModelCalls);
    }

    [Fact]
    public async Task JudgeAsync_OneTree_NoStability()
    {
        var (model, scorer) = Sampled(_ => "A.");

        var verdict = await Engine(model, scorer, SampledLevel).JudgeAsync(Claim, CancellationToken.None);

        Assert.Null(verdict.Stability);
        Assert.All(model.Generations, g => Assert.Equal(0, g.SampleIndex));
    }

    [Fact]
    public void Constructor_InvalidSettings_ThrowsListingEveryProblem()
    {
        var (model, scorer) = Example(0.7);

        var error = Assert.Throws<ArgumentException>(() => Engine(model, scorer, OneLevel with { Samples = 0, IntegrityGap = 1.5, LinkFloor = -0.1 }));

        Assert.Contains("sampled trees", error.Message, StringComparison.Ordinal);
        Assert.Contains("integrity gap", error.Message, StringComparison.Ordinal);
        Assert.Contains("link floor", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(0.7, 0.0, ClaimStatus.Overturned)]
    [InlineData(0.3, 0.0, ClaimStatus.Settled)]
    [InlineData(0.7, 0.1, ClaimStatus.Contested)] // margin equal to the threshold is contested
    [InlineData(0.3, 0.1, ClaimStatus.Contested)]
    [InlineData(0.3, 0.09, ClaimStatus.Settled)]
    public async Task JudgeAsync_DirectAnswerAndThreshold_GiveStatus(double directPTrue, double threshold, ClaimStatus expected)
    {
        var (model, scorer) = Example(directPTrue);

        var verdict = await Engine(model, scorer, OneLevel with { ContestedThreshold = threshold }).JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal(expected, verdict.Status);
    }

    [Fact]
    public async Task JudgeAsync_NoExplanations_TieIsContestedAndKeepsDirectAnswer()
    {
        var model = new ScriptedModel();
        model.PTrue["C"] = 0.6;
        model.PTrue["Not: C"] = 0.6;
        var scorer = new ScriptedScorer();

        var verdict = await Engine(model, scorer).JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal(ClaimStatus.Contested, verdict.Status);
        Assert.Equal(0.0, verdict.Margin);
        Assert.True(verdict.Answer);
        Assert.True(verdict.DirectAnswer);
        Assert.Empty(scorer.Batches);
        Assert.Equal(0, verdict.ObjectiveCost);
    }

    [Fact]
    public async Task JudgeAsync_MissingAnswer_FailedWithClaimAndReason()
    {
        var (model, scorer) = Example(0.7);
        model.PTrue.Remove("Not: B");

        var verdict = await Engine(model, scorer).JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal(ClaimStatus.Failed, verdict.Status);
        Assert.Null(verdict.Answer);
        Assert.Contains("claim c1", verdict.Error, StringComparison.Ordinal);
        Assert.Contains("explanation tree", verdict.Error, StringComparison.Ordinal);
        Assert.Contains("Not: B", verdict.Error, StringComparison.Ordinal);
        Assert.True(verdict.ModelCalls > 0);
        Assert.Empty(scorer.Batches);
    }

    [Fact]
    public async Task JudgeAsync_SolverWithoutSolution_FailedNamingTheSolver()
    {
        var (model, scorer) = Example(0.7);

        var verdict = await Engine(model, scorer, solver: new NoSolution()).JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal(ClaimStatus.Failed, verdict.Status);
        Assert.Contains("solving with no-solution", verdict.Error, StringComparison.Ordinal);
        Assert.True(verdict.DirectAnswer);
        Assert.NotNull(verdict.Tree);
    }

    [Fact]
    public async Task JudgeAsync_HandBuiltExample_ValuesAndDecidingClausesAsComputedByHand()
    {
        var (model, scorer) = Example(directPTrue: 0.7);

        var verdict = await Engine(model, scorer).JudgeAsync(Claim, CancellationToken.None);

        // By hand (see Example): the optimum holds C false, A false, B true; the best with C true holds
        // A true, B false and breaks only "belief: #2".
        Assert.Equal(new Dictionary<int, bool> { [0] = false, [1] = false, [2] = true }, verdict.Values);
        var other = Assert.Single(verdict.FalsifiedWithOtherAnswer);
        Assert.Equal((ClauseOrigin.Belief(2), 0.9), (other.Origin, other.Weight));
        // Six ordered pairs among three statements, each with the scores the scorer gave that pair.
        Assert.Equal(6, verdict.Pairs.Count);
        Assert.Equal(ScriptedScorer.Contradicts(0.8), verdict.Pairs.Single(p => (p.From, p.To) == (2, 0)).Scores);
        Assert.Equal(ScriptedScorer.Neutral, verdict.Pairs.Single(p => (p.From, p.To) == (0, 2)).Scores);
    }

    [Fact]
    public async Task JudgeAsync_ScorerReturnsTooFewResults_FailedNamingTheCount()
    {
        var (model, _) = Example(0.7);

        var verdict = await Engine(model, new ShortScorer()).JudgeAsync(Claim, CancellationToken.None);

        Assert.Equal(ClaimStatus.Failed, verdict.Status);
        Assert.Contains("returned 5 results for 6 statement pairs", verdict.Error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task JudgeAsync_UnknownExceptionInTheScorer_PropagatesAsABug()
    {
        var (model, _) = Example(0.7);

        await Assert.ThrowsAsync<FormatException>(() => Engine(model, new ThrowingScorer(new FormatException())).JudgeAsync(Claim, CancellationToken.None));
    }

    [Fact]
    public async Task JudgeAsync_RunHalted_PropagatesInsteadOfFailingTheClaim()
    {
        var (model, _) = Example(0.7);

        var halted = await Assert.ThrowsAsync<RunHaltedException>(
            () => Engine(model, new ThrowingScorer(new RunHaltedException("budget of 10 calls spent"))).JudgeAsync(Claim, CancellationToken.None));

        Assert.Equal("budget of 10 calls spent", halted.Message);
    }

    [Fact]
    public async Task JudgeAsync_Cancelled_Throws()
    {
        var (_, scorer) = Example(0.7);
        var slow = new ScriptedModel { PTrueWith = _ => 0.5, Latency = TimeSpan.FromSeconds(30) };
        using var cancellation = new CancellationTokenSource(TimeSpan.FromMilliseconds(50));

        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => Engine(slow, scorer).JudgeAsync(Claim, cancellation.Token));
    }

    [Fact]
    public async Task JudgeAllAsync_OneClaimFails_OthersStillJudgedInOrder()
    {
        var (model, scorer) = Example(0.7);
        var claims = new[] { new Claim("bad", "Unknown claim"), Claim }.ToAsyncEnumerable();

        var verdicts = new List<Verdict>();
        await foreach (var verdict in Engine(model, scorer).JudgeAllAsync(claims, CancellationToken.None))
        {
            verdicts.Add(verdict);
        }

        Assert.Equal(["bad", "c1"], verdicts.Select(v => v.Claim.Id));
        Assert.Equal([ClaimStatus.Failed, ClaimStatus.Overturned], verdicts.Select(v => v.Status));
    }

    [Fact]
    public async Task JudgeAsync_DefaultShapeWithLatency_RequestsOfALevelOverlap()
    {
        var model = ScriptedModel.Growing(s => s.StartsWith("Not: ", StringComparison.Ordinal) ? 0.3 : 0.6, TimeSpan.FromMilliseconds(40));

        var verdict = await Engine(model, new ScriptedScorer(), PlainMethod with { DiscardCutOff = false }).JudgeAsync(Claim, CancellationToken.None);

        Assert.NotEqual(ClaimStatus.Failed, verdict.Status);
        Assert.True(model.MaxInFlight > 1, $"only {model.MaxInFlight} request in flight at a time");
    }

    [Theory]
    [InlineData(Integrity.IntegralTrue, Integrity.IntegralFalse, true, true)]
    [InlineData(Integrity.IntegralTrue, Integrity.NotIntegral, true, false)]
    [InlineData(Integrity.IntegralTrue, Integrity.IntegralTrue, false, false)]
    public void IsTwoSided_KeptIntegralExplanationsForBothAnswers(Integrity forTrue, Integrity forFalse, bool secondKept, bool expected)
    {
        var tree = new ExplanationTree(
        [
            Node(0, null, Integrity.NotIntegral),
            Node(1, 0, forTrue, generatedFor: true),
            Node(2, 0, forFalse, generatedFor: false) with { Kept = secondKept },
        ]);

        Assert.Equal(expected, CoherenceEngine.IsTwoSided(tree));
    }

    [Fact]
    public async Task JudgeAsync_OneSolveUnproven_StatusIsTheWeakerOne()
    {
        var (model, scorer) = Example(0.7);

        var verdict = await Engine(model, scorer, solver: new UnprovenWhenClaimTrue()).JudgeAsync(Claim, CancellationToken.None);

        // The optimum (claim false) is proven, the other side is not, so neither is the margin.
        Assert.False(verdict.Answer);
        Assert.Equal(SolveStatus.Feasible, verdict.SolveStatus);
    }

    private sealed class UnprovenWhenClaimTrue : IMaxSatSolver
    {
        private readonly ExhaustiveSolver inner = new();

        public string Describe => "unproven";

        public async Task<MaxSatSolution> SolveAsync(MaxSatProblem problem, CancellationToken cancellationToken)
        {
            var solution = await inner.SolveAsync(problem, cancellationToken);
            return problem.Clauses.Any(c => c.IsHard && c.Literals.SequenceEqual([1])) ? solution with { Status = SolveStatus.Feasible } : solution;
        }
    }

    private sealed class ShortScorer : IEntailmentScorer
    {
        public string Describe => "short";

        public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken) =>
            Task.FromResult<IReadOnlyList<EntailmentScores>>([.. pairs.Skip(1).Select(_ => ScriptedScorer.Neutral)]);
    }

    private sealed class ThrowingScorer(Exception exception) : IEntailmentScorer
    {
        public string Describe => "throwing";

        public Task<IReadOnlyList<EntailmentScores>> ScoreAsync(IReadOnlyList<SentencePair> pairs, CancellationToken cancellationToken) =>
            Task.FromException<IReadOnlyList<EntailmentScores>>(exception);
    }

    private sealed class NoSolution : IMaxSatSolver
    {
        public string Describe => "no-solution";

        public Task<MaxSatSolution> SolveAsync(MaxSatProblem problem, CancellationToken cancellationToken) =>
            Task.FromResult(new MaxSatSolution(SolveStatus.Unknown, 0, [], [], TimeSpan.Zero));
    }
}
