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

    [Fact]
    public void OrderedPairs_KeptStatements_EveryOrderedPairOnce() =>
        Assert.Equal([(0, 1), (0, 2), (1, 0), (1, 2), (2, 0), (2, 1)], ClauseBuilder.OrderedPairs(Tree).Select(p => (p.Premise.Id, p.Hypothesis.Id)));

    [Fact]
    public void Build_UnitWeighting_ExactClausesAndScaledWeights()
    {
        var built = ClauseBuilder.Build(Tree, Scored(Tree, Scores), ClauseWeighting.Unit, 1000);

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
        var built = ClauseBuilder.Build(Tree, Scored(Tree, Scores), ClauseWeighting.NliProbability, 1000);

        Assert.Equal([800L, 750L, 900L, 600L, 700L, 400L], built.Problem.Problem.Clauses.Select(c => c.Weight));
    }

    [Fact]
    public void Build_SmallScale_RoundsHalfAwayFromZero()
    {
        var built = ClauseBuilder.Build(Tree, Scored(Tree, Scores), ClauseWeighting.Unit, 10);

        // 0.25 -> 1 - 0.25 = 0.75 -> 7.5 -> 8.
        Assert.Equal([8L, 8L, 10L, 10L, 10L, 10L], built.Problem.Problem.Clauses.Select(c => c.Weight));
    }

    [Fact]
    public void Build_RootAloneAndIntegral_RootIsALeafWithBelief()
    {
        var tree = new ExplanationTree([Node(0, null, Integrity.IntegralFalse, belief: 0.4)]);

        var built = ClauseBuilder.Build(tree, [], ClauseWeighting.Unit, 1000);

        Assert.Equal([("belief: #0", 600L, "-1")], Describe(built.Problem));
    }

    [Fact]
    public void Build_PairsInAnotherOrder_SameClausesBecauseEachPairCarriesItsScores()
    {
        var reversed = Enumerable.Reverse(Scored(Tree, Scores)).ToList();

        var built = ClauseBuilder.Build(Tree, reversed, ClauseWeighting.Unit, 1000);

        Assert.Equal(
            Describe(ClauseBuilder.Build(Tree, Scored(Tree, Scores), ClauseWeighting.Unit, 1000).Problem).Order(),
            Describe(built.Problem).Order());
    }

    [Fact]
    public void Build_Origins_AreTypedWithTheirStatements()
    {
        var origins = ClauseBuilder.Build(Tree, Scored(Tree, Scores), ClauseWeighting.Unit, 1000).Problem.Origins;

        Assert.Equal(new ClauseOrigin(ClauseKind.Belief, 1), origins[0]);
        Assert.Equal(new ClauseOrigin(ClauseKind.Entailment, 1, 0), origins[2]);
        Assert.Equal([2, 0], origins[4].Statements);
        Assert.Equal(ClauseKind.Contradiction, origins[4].Kind);
    }

    /// <summary>The ordered pairs with the scores listed above, each pair carrying its own.</summary>
    private static List<PairScore> Scored(ExplanationTree tree, EntailmentScores[] scores) =>
        [.. ClauseBuilder.OrderedPairs(tree).Zip(scores, (pair, score) => new PairScore(pair.Premise.Id, pair.Hypothesis.Id, score))];

    private static List<(string Origin, long Weight, string Literals)> Describe(CoherenceProblem problem) =>
        [.. problem.Problem.Clauses.Select((c, i) => (problem.Origins[i].ToString(), c.Weight, string.Join(' ', c.Literals)))];
}
