using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Trees;
using static Plumbline.Core.Tests.Coherence.TreeBuilderTests;

namespace Plumbline.Core.Tests.Coherence;

public sealed class ClauseBuilderTests
{
    // Root #0 (kept, explained), #1 integral/True with belief 0.8, #2 integral/False with belief 0.25,
    // #3 pruned. Variables: #0 -> 1, #1 -> 2, #2 -> 3.
    private static readonly ExplanationTree Tree = new(
    [
        Node(0, null, Integrity.NotIntegral),
        Node(1, 0, Integrity.IntegralTrue, belief: 0.8),
        Node(2, 0, Integrity.IntegralFalse, belief: 0.25, generatedFor: false),
        Node(3, 0, Integrity.NotIntegral) with { Kept = false },
    ]);

    // Pair order: (0,1) (0,2) (1,0) (1,2) (2,0) (2,1).
    private static readonly EntailmentScores[] Scores =
    [
        new(0.2, 0.7, 0.1),
        new(0.3, 0.4, 0.3),
        new(0.9, 0.05, 0.05),
        new(0.1, 0.3, 0.6),
        new(0.2, 0.1, 0.7),
        new(0.4, 0.35, 0.25),
    ];

    private static readonly ClauseRules Unit = new(ClauseWeighting.Unit, 1000);

    [Fact]
    public void OrderedPairs_KeptStatements_EveryOrderedPairOnce() =>
        Assert.Equal([(0, 1), (0, 2), (1, 0), (1, 2), (2, 0), (2, 1)], ClauseBuilder.OrderedPairs(Tree).Select(p => (p.Premise.Id, p.Hypothesis.Id)));

    /// <summary>Scores the tree's pairs in pair order, as the engine does.</summary>
    internal static BuiltClauses Build(ExplanationTree tree, IReadOnlyList<EntailmentScores> scores, ClauseRules rules, NliText nliText = NliText.Statement)
    {
        Assert.Equal(ClauseBuilder.OrderedPairs(tree).Count, scores.Count);
        return ClauseBuilder.Build(tree, Scored(tree, scores, nliText), rules with { NliText = nliText });
    }

    [Fact]
    public void Build_UnitWeighting_ExactClausesAndScaledWeights()
    {
        var built = Build(Tree, Scores, Unit);

        var problem = built.Problem;
        Assert.Equal(3, problem.Problem.VariableCount);
        Assert.Equal([0, 1, 2], problem.StatementOfVariable);
        Assert.Equal(1000, problem.Scale);
        Assert.Equal(
            [
                ("belief: #1", 800L, "2"),
                ("belief: #2", 750L, "-3"),
                ("#1 entails #0", 1000L, "-2 1"),
                ("#1 contradicts #2", 1000L, "-2 -3"),
                ("#2 contradicts #0", 1000L, "-3 -1"),
                ("#2 entails #1", 1000L, "-3 2"),
            ],
            Describe(problem));
        Assert.All(problem.Problem.Clauses, c => Assert.False(c.IsHard));
        Assert.Equal(
            [
                new Link(1, 0, EntailmentKind.Entailment, 0.9),
                new Link(1, 2, EntailmentKind.Contradiction, 0.6),
                new Link(2, 0, EntailmentKind.Contradiction, 0.7),
                new Link(2, 1, EntailmentKind.Entailment, 0.4),
            ],
            built.Links);
    }

    [Fact]
    public void Build_NliProbabilityWeighting_LinksWeighTheirProbability()
    {
        var built = Build(Tree, Scores, Unit with { Weighting = ClauseWeighting.NliProbability });

        Assert.Equal([800L, 750L, 900L, 600L, 700L, 400L], built.Problem.Problem.Clauses.Select(c => c.Weight));
    }

    [Fact]
    public void Build_SmallScale_RoundsHalfAwayFromZero()
    {
        var built = Build(Tree, Scores, Unit with { Scale = 10 });

        // 0.25 -> 1 - 0.25 = 0.75 -> 7.5 -> 8.
        Assert.Equal([8L, 8L, 10L, 10L, 10L, 10L], built.Problem.Problem.Clauses.Select(c => c.Weight));
    }

    [Fact]
    public void Build_RootAloneAndIntegral_RootIsALeafWithBelief()
    {
        var tree = new ExplanationTree([Node(0, null, Integrity.IntegralFalse, belief: 0.4)]);

        var built = Build(tree, [], Unit);

        Assert.Equal([("belief: #0", 600L, "-1")], Describe(built.Problem));
    }

    [Fact]
    public void Build_KeepConflicts_ConflictListedAndBothLinksStay()
    {
        var built = Build(Tree, Scores, Unit);

        // #1 -> #2 reads contradiction (0.6) and #2 -> #1 entailment (0.4): the model disagrees with itself.
        var conflict = Assert.Single(built.Conflicts);
        Assert.Equal(new LinkConflict(new Link(2, 1, EntailmentKind.Entailment, 0.4), new Link(1, 2, EntailmentKind.Contradiction, 0.6), Dropped: false), conflict);
        Assert.Equal(4, built.Links.Count);
    }

    [Fact]
    public void Build_DropConflicts_BothDirectionsOfTheConflictingPairGoAndAreListed()
    {
        var built = Build(Tree, Scores, Unit with { Conflicts = ConflictRule.Drop });

        Assert.Equal(
            [
                ("belief: #1", 800L, "2"),
                ("belief: #2", 750L, "-3"),
                ("#1 entails #0", 1000L, "-2 1"),
                ("#2 contradicts #0", 1000L, "-3 -1"),
            ],
            Describe(built.Problem));
        Assert.Equal([new Link(1, 0, EntailmentKind.Entailment, 0.9), new Link(2, 0, EntailmentKind.Contradiction, 0.7)], built.Links);
        Assert.True(Assert.Single(built.Conflicts).Dropped);
    }

    [Fact]
    public void Build_LinkFloor_WeakerLinksIgnoredBeforeConflictsAreSought()
    {
        // Floor 0.65: 0.9 and 0.7 stay; 0.6 (#1 -> #2) and 0.4 (#2 -> #1) are ignored, so no conflict is left either.
        var built = Build(Tree, Scores, Unit with { LinkFloor = 0.65, Conflicts = ConflictRule.Drop });

        Assert.Equal([new Link(1, 0, EntailmentKind.Entailment, 0.9), new Link(2, 0, EntailmentKind.Contradiction, 0.7)], built.Links);
        Assert.Empty(built.Conflicts);
        Assert.Equal(["belief: #1", "belief: #2", "#1 entails #0", "#2 contradicts #0"], built.Problem.Origins.Select(o => o.ToString()));
    }

    [Fact]
    public void Build_LinkFloorEqualToProbability_LinkKept()
    {
        var built = Build(Tree, Scores, Unit with { LinkFloor = 0.7 });

        Assert.Contains(new Link(2, 0, EntailmentKind.Contradiction, 0.7), built.Links);
        Assert.DoesNotContain(built.Links, l => l.Probability < 0.7);
    }

    [Fact]
    public void Build_NormalisedDifferenceBelief_WeightsAreTwiceBeliefMinusOne()
    {
        // #1: belief 0.8 -> |2 x 0.8 - 1| = 0.6; #2: belief 0.25 -> |2 x 0.25 - 1| = 0.5 (on its negation).
        var built = Build(Tree, Scores, Unit with { BeliefForm = BeliefForm.NormalisedDifference });

        Assert.Equal([("belief: #1", 600L, "2"), ("belief: #2", 500L, "-3")], Describe(built.Problem).Take(2));
    }

    // Contradiction read both ways between #0 and #2 (0.8 and 0.7); the rest neutral.
    private static readonly EntailmentScores[] BothWays =
    [
        new(0.2, 0.7, 0.1),
        new(0.1, 0.1, 0.8),
        new(0.2, 0.7, 0.1),
        new(0.2, 0.7, 0.1),
        new(0.2, 0.1, 0.7),
        new(0.2, 0.7, 0.1),
    ];

    [Fact]
    public void Build_ContradictionEachDirection_TwoClausesForAPairReadBothWays()
    {
        var built = Build(Tree, BothWays, Unit);

        Assert.Equal([("#0 contradicts #2", 1000L, "-1 -3"), ("#2 contradicts #0", 1000L, "-3 -1")], Describe(built.Problem).Skip(2));
    }

    [Theory]
    [InlineData(ClauseWeighting.Unit, 1000L)]
    [InlineData(ClauseWeighting.NliProbability, 800L)] // the stronger of 0.8 and 0.7
    public void Build_ContradictionOncePerPair_OneClauseForAPairReadBothWays(ClauseWeighting weighting, long weight)
    {
        var built = Build(Tree, BothWays, Unit with { Contradictions = ContradictionCount.OncePerPair, Weighting = weighting });

        Assert.Equal([("#0 contradicts #2", weight, "-1 -3")], Describe(built.Problem).Skip(2));
        Assert.Equal(2, built.Links.Count);
    }

    [Fact]
    public void Build_NliOnNegationWhenFalse_FalseStatementScoredByItsNegationAndItsVariableNegated()
    {
        var pairs = ClauseBuilder.OrderedPairs(Tree, NliText.NegationWhenFalse);
        var built = Build(Tree, Scores, Unit, NliText.NegationWhenFalse);

        // #2 is integral/False: "not S2" stands for it; the claim (#0) and #1 keep their own text.
        Assert.Equal(("S0", "not S2"), (pairs[1].PremiseText, pairs[1].HypothesisText));
        Assert.Equal(("S1", "S0"), (pairs[2].PremiseText, pairs[2].HypothesisText));
        // "~#2 contradicts #0" says not (not x3 and x1), that is x3 or not x1.
        Assert.Equal(
            [
                ("belief: #1", 800L, "2"),
                ("belief: #2", 750L, "-3"),
                ("#1 entails #0", 1000L, "-2 1"),
                ("#1 contradicts ~#2", 1000L, "-2 3"),
                ("~#2 contradicts #0", 1000L, "3 -1"),
                ("~#2 entails #1", 1000L, "3 2"),
            ],
            Describe(built.Problem));
        Assert.Equal(new Link(2, 0, EntailmentKind.Contradiction, 0.7, FromNegation: true), built.Links[2]);
    }

    [Theory]
    [InlineData(BeliefForm.Ratio, 700L)]
    [InlineData(BeliefForm.NormalisedDifference, 400L)]
    public void Build_ClaimBelief_UnitClauseOnTheClaimsBelievedSide(BeliefForm form, long weight)
    {
        // The claim is not integral but leans false: belief 0.3 -> "not #0" with 1 - 0.3 or |2 x 0.3 - 1|.
        var tree = new ExplanationTree([Node(0, null, Integrity.NotIntegral, belief: 0.3), Node(1, 0, Integrity.IntegralTrue, belief: 0.9)]);
        var neutral = new EntailmentScores(0.1, 0.8, 0.1);

        var with = Build(tree, [neutral, neutral], Unit with { ClaimBelief = true, BeliefForm = form });
        var without = Build(tree, [neutral, neutral], Unit with { BeliefForm = form });

        Assert.Equal(("belief: #0", weight, "-1"), Describe(with.Problem)[1]);
        Assert.Single(without.Problem.Origins);
    }

    [Fact]
    public void Build_ClaimBeliefWhenTheClaimIsAnIntegralLeaf_NotAddedTwice()
    {
        var tree = new ExplanationTree([Node(0, null, Integrity.IntegralTrue, belief: 0.8)]);

        var built = Build(tree, [], Unit with { ClaimBelief = true });

        Assert.Equal([("belief: #0", 800L, "1")], Describe(built.Problem));
    }

    [Fact]
    public void Build_PairsInAnotherOrder_SameClausesBecauseEachPairCarriesItsScores()
    {
        var reversed = Enumerable.Reverse(Scored(Tree, Scores)).ToList();

        var built = ClauseBuilder.Build(Tree, reversed, Unit);

        Assert.Equal(
            Describe(ClauseBuilder.Build(Tree, Scored(Tree, Scores), Unit).Problem).Order(),
            Describe(built.Problem).Order());
    }

    [Fact]
    public void Build_Origins_AreTypedWithTheirStatements()
    {
        var origins = ClauseBuilder.Build(Tree, Scored(Tree, Scores), Unit).Problem.Origins;

        Assert.Equal(new ClauseOrigin(ClauseKind.Belief, 1), origins[0]);
        Assert.Equal(new ClauseOrigin(ClauseKind.Entailment, 1, 0), origins[2]);
        Assert.Equal([2, 0], origins[4].Statements);
        Assert.Equal(ClauseKind.Contradiction, origins[4].Kind);
    }

    /// <summary>The ordered pairs with the scores listed above, each pair carrying its own.</summary>
    private static List<PairScore> Scored(ExplanationTree tree, IReadOnlyList<EntailmentScores> scores, NliText nliText = NliText.Statement) =>
        [.. ClauseBuilder.OrderedPairs(tree, nliText).Zip(scores, (pair, score) => new PairScore(pair.Premise.Id, pair.Hypothesis.Id, score, pair.PremiseNegated, pair.HypothesisNegated))];

    private static List<(string Origin, long Weight, string Literals)> Describe(CoherenceProblem problem) =>
        [.. problem.Problem.Clauses.Select((c, i) => (problem.Origins[i].ToString(), c.Weight, string.Join(' ', c.Literals)))];
}
