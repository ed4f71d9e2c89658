using System.Runtime.CompilerServices;
using Plumbline.Core.Claims;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>
/// Judges claims: grows the explanation tree, scores every ordered pair of kept statements with the
/// NLI model, and solves the weighted MAX-SAT problem for the most coherent truth assignment.
/// </summary>
public sealed class CoherenceEngine : IClaimJudge
{
    private readonly IEntailmentScorer scorer;
    private readonly IMaxSatSolver solver;
    private readonly CoherenceOptions options;
    private readonly TimeProvider time;
    private readonly TreeBuilder treeBuilder;
    private readonly ClauseRules clauseRules;

    public CoherenceEngine(
        ILanguageModel model,
        IEntailmentScorer scorer,
        IMaxSatSolver solver,
        CoherenceOptions options,
        TimeProvider time)
    {
        ArgumentNullException.ThrowIfNull(model);
        this.scorer = scorer ?? throw new ArgumentNullException(nameof(scorer));
        this.solver = solver ?? throw new ArgumentNullException(nameof(solver));
        this.options = options ?? throw new ArgumentNullException(nameof(options));
        this.time = time ?? throw new ArgumentNullException(nameof(time));
        if (options.Problems() is { Count: > 0 } problems)
        {
            throw new ArgumentException(string.Join("; ", problems), nameof(options));
        }

        treeBuilder = new TreeBuilder(model, options.Shape, options.Negation, TreeRules.From(options));
        clauseRules = ClauseRules.From(options);
    }

    /// <summary>
    /// Judges one claim: one tree, or <see cref="CoherenceOptions.Samples"/> independently sampled trees
    /// whose majority answer becomes the answer. A failing backend gives a verdict with status
    /// <see cref="ClaimStatus.Failed"/> instead of an exception, so that one bad claim does not lose a run;
    /// only cancellation throws.
    /// </summary>
    public async Task<Verdict> JudgeAsync(Claim claim, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(claim);
        if (options.Samples == 1)
        {
            return await JudgeTreeAsync(claim, 0, cancellationToken);
        }

        var trees = await Task.WhenAll(Enumerable.Range(0, options.Samples).Select(i => JudgeTreeAsync(claim, i, cancellationToken)));
        return Majority(trees);
    }

    /// <summary>
    /// Combines the verdicts of sampled trees of one claim: the answer most trees give, with the details
    /// (tree, links, margin) of the first tree that gives it. A tie keeps the direct answer and is contested.
    /// Calls, tokens, time and cut-off counts add up over all trees. Any failed tree fails the claim.
    /// </summary>
    internal Verdict Majority(IReadOnlyList<Verdict> trees)
    {
        var calls = trees.Sum(t => t.ModelCalls);
        var tokens = trees.Aggregate(TokenUsage.None, (sum, t) => sum + t.Tokens);
        var timings = new VerdictTimings(
            TimeSpan.FromTicks(trees.Sum(t => t.Timings.Tree.Ticks)),
            TimeSpan.FromTicks(trees.Sum(t => t.Timings.Nli.Ticks)),
            TimeSpan.FromTicks(trees.Sum(t => t.Timings.Solve.Ticks)));
        var cutOff = trees.Sum(t => t.CutOffDiscarded);
        var failed = trees.Select((t, i) => (Tree: t, Index: i)).FirstOrDefault(t => t.Tree.IsFailed);
        if (failed.Tree is { } broken)
        {
            return broken with
            {
                Error = $"{broken.Error} (sampled tree {failed.Index + 1} of {trees.Count})",
                ModelCalls = calls,
                Tokens = tokens,
                Timings = timings,
                CutOffDiscarded = cutOff,
            };
        }

        var trueCount = trees.Count(t => t.Answer == true);
        var tied = 2 * trueCount == trees.Count;
        var majority = tied ? ChosenDirectAnswer(trees[0]) : 2 * trueCount > trees.Count;
        var chosen = trees.First(t => t.Answer == majority);
        return chosen with
        {
            Status = tied ? ClaimStatus.Contested : chosen.Status,
            ModelCalls = calls,
            Tokens = tokens,
            ProbabilitiesEstimated = trees.Any(t => t.ProbabilitiesEstimated),
            Timings = timings,
            CutOffDiscarded = cutOff,
            Stability = new SampleAgreement(trees.Count, trees.Count(t => t.Answer == majority), tied),
        };
    }

    private async Task<Verdict> JudgeTreeAsync(Claim claim, int sampleIndex, CancellationToken cancellationToken)
    {
        var meter = new CallMeter();
        var stage = "building the explanation tree";
        BuiltTree? built = null;
        TimeSpan treeTime = TimeSpan.Zero, nliTime = TimeSpan.Zero, solveTime = TimeSpan.Zero;
        var started = time.GetTimestamp();
        try
        {
            built = await treeBuilder.BuildAsync(claim.Text, meter, cancellationToken, sampleIndex);
            treeTime = time.GetElapsedTime(started);
            var tree = built.Tree;

            stage = $"scoring statement pairs with {scorer.Describe}";
            started = time.GetTimestamp();
            var scored = await ScorePairsAsync(tree, cancellationToken);
            var clauses = ClauseBuilder.Build(tree, scored, clauseRules);
            nliTime = time.GetElapsedTime(started);

            stage = $"solving with {solver.Describe}";
            started = time.GetTimestamp();
            var problem = clauses.Problem;
            var rootVariable = problem.VariableOf(tree.Root.Id);
            // One solve per value of the claim, side by side: the cheaper one is the optimum and the
            // other one's extra cost is the margin. A tie keeps the direct answer (and is contested),
            // so the outcome never depends on which of two equal optima a solver happens to return.
            var solutions = await Task.WhenAll(
                solver.SolveAsync(problem.Problem.With(WeightedClause.Hard(rootVariable)), cancellationToken),
                solver.SolveAsync(problem.Problem.With(WeightedClause.Hard(-rootVariable)), cancellationToken));
            var (ifTrue, ifFalse) = (RequireAssignment(solutions[0]), RequireAssignment(solutions[1]));
            var direct = options.DirectAnswer == DirectAnswerRule.Paired ? built.PairedDirectAnswer : built.DirectAnswer;
            var answer = ifTrue.Cost == ifFalse.Cost ? direct : ifTrue.Cost < ifFalse.Cost;
            var (best, other) = answer ? (ifTrue, ifFalse) : (ifFalse, ifTrue);
            solveTime = time.GetElapsedTime(started);

            var margin = (double)(other.Cost - best.Cost) / problem.Scale;
            var totalWeight = problem.Problem.Clauses.Sum(c => c.Weight);
            var status = margin <= options.ContestedThreshold ? ClaimStatus.Contested
                : answer != direct ? ClaimStatus.Overturned
                : ClaimStatus.Settled;

            return new Verdict(
                claim,
                answer,
                built.DirectAnswer,
                status,
                margin,
                IsTwoSided(tree),
                tree,
                clauses.Links,
                FalsifiedBy(problem, best.Assignment),
                other.Status == SolveStatus.Optimal ? best.Status : other.Status,
                best.Cost,
                tree.Statements.Count(s => s.IsIntegral),
                tree.Statements.Count(s => !s.Kept),
                meter.Calls,
                meter.Tokens,
                meter.Estimated,
                new VerdictTimings(treeTime, nliTime, solveTime),
                Error: null,
                Problem: problem)
            {
                Pairs = scored,
                PairedDirectAnswer = built.PairedDirectAnswer,
                NormalisedMargin = totalWeight == 0 ? 0.0 : (double)(other.Cost - best.Cost) / totalWeight,
                Values = ValuesOf(problem, best.Assignment),
                Conflicts = clauses.Conflicts,
                CutOffDiscarded = built.CutOffDiscarded,
                FalsifiedWithOtherAnswer = FalsifiedBy(problem, other.Assignment),
            };
        }
        catch (Exception ex) when (IsKnownFailure(ex))
        {
            return Verdict.Failed(
                claim,
                $"claim {claim.Id}: {stage} failed: {ex.Message}",
                built?.Tree,
                built?.DirectAnswer,
                meter.Calls,
                meter.Tokens,
                new VerdictTimings(treeTime, nliTime, solveTime)) with
            {
                PairedDirectAnswer = built?.PairedDirectAnswer,
                CutOffDiscarded = built?.CutOffDiscarded ?? 0,
            };
        }
    }

    /// <summary>
    /// Failures a claim can meet in normal operation: a backend that cannot answer, an NLI batch that cannot be
    /// scored, a solve without an assignment. Anything else (cancellation, a halted run, a bug) propagates.
    /// </summary>
    internal static bool IsKnownFailure(Exception e) =>
        e is ModelRequestException or EntailmentScoringException or MaxSatSolverException;

    /// <summary>Scores every ordered pair of kept statements in one batch and keeps each pair with its scores.</summary>
    private async Task<IReadOnlyList<PairScore>> ScorePairsAsync(ExplanationTree tree, CancellationToken cancellationToken)
    {
        var pairs = ClauseBuilder.OrderedPairs(tree, options.NliText);
        if (pairs.Count == 0)
        {
            return [];
        }

        var scores = await scorer.ScoreAsync([.. pairs.Select(p => p.Sentences)], cancellationToken);
        if (scores.Count != pairs.Count)
        {
            throw new EntailmentScoringException($"the NLI scorer returned {scores.Count} results for {pairs.Count} statement pairs");
        }

        var scored = new PairScore[pairs.Count];
        for (var i = 0; i < pairs.Count; i++)
        {
            var pair = pairs[i];
            scored[i] = new PairScore(pair.Premise.Id, pair.Hypothesis.Id, scores[i], pair.PremiseNegated, pair.HypothesisNegated);
        }

        return scored;
    }

    /// <summary>The value of every kept statement in an assignment, by statement id.</summary>
    private static Dictionary<int, bool> ValuesOf(CoherenceProblem problem, IReadOnlyList<bool> assignment)
    {
        var values = new Dictionary<int, bool>(problem.StatementOfVariable.Count);
        for (var v = 0; v < problem.StatementOfVariable.Count; v++)
        {
            values[problem.StatementOfVariable[v]] = assignment[v];
        }

        return values;
    }

    /// <summary>Judges claims one after another (requests within a claim run concurrently), yielding each verdict as it is ready.</summary>
    public async IAsyncEnumerable<Verdict> JudgeAllAsync(
        IAsyncEnumerable<Claim> claims,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(claims);
        await foreach (var claim in claims.WithCancellation(cancellationToken))
        {
            yield return await JudgeAsync(claim, cancellationToken);
        }
    }

    /// <summary>The claim's own kept explanations include an integral one written for True and one written for False.</summary>
    internal static bool IsTwoSided(ExplanationTree tree)
    {
        var explanations = tree.Statements.Where(s => s.Kept && s.Depth == 1 && s.IsIntegral).ToList();
        return explanations.Any(s => s.GeneratedFor == true) && explanations.Any(s => s.GeneratedFor == false);
    }

    private bool ChosenDirectAnswer(Verdict verdict) =>
        (options.DirectAnswer == DirectAnswerRule.Paired ? verdict.PairedDirectAnswer : verdict.DirectAnswer) ?? false;

    private static MaxSatSolution RequireAssignment(MaxSatSolution solution) =>
        solution.HasAssignment
            ? solution
            : throw new MaxSatSolverException($"the solver found no assignment (status {solution.Status})");

    private static List<FalsifiedClause> FalsifiedBy(CoherenceProblem problem, IReadOnlyList<bool> assignment)
    {
        var falsified = new List<FalsifiedClause>();
        var clauses = problem.Problem.Clauses;
        for (var i = 0; i < clauses.Count; i++)
        {
            if (!clauses[i].IsSatisfiedBy(assignment))
            {
                falsified.Add(new FalsifiedClause(i, problem.Origins[i], clauses[i].Literals, (double)clauses[i].Weight / problem.Scale));
            }
        }

        return falsified;
    }
}
