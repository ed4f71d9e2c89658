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
        if (options.Shape.Levels.Count == 0 || options.Shape.Levels.Any(l => l.Width < 1))
        {
            throw new ArgumentException("the tree shape needs at least one level, each of width 1 or more", nameof(options));
        }

        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(options.WeightScale);
        treeBuilder = new TreeBuilder(model, options.Shape, options.Negation);
    }

    /// <summary>
    /// Judges one claim. A failing backend gives a verdict with status <see cref="ClaimStatus.Failed"/>
    /// instead of an exception, so that one bad claim does not lose a run; only cancellation throws.
    /// </summary>
    public async Task<Verdict> JudgeAsync(Claim claim, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(claim);
        var meter = new CallMeter();
        var stage = "building the explanation tree";
        BuiltTree? built = null;
        TimeSpan treeTime = TimeSpan.Zero, nliTime = TimeSpan.Zero, solveTime = TimeSpan.Zero;
        var started = time.GetTimestamp();
        try
        {
            built = await treeBuilder.BuildAsync(claim.Text, meter, cancellationToken);
            treeTime = time.GetElapsedTime(started);
            var tree = built.Tree;

            stage = $"scoring statement pairs with {scorer.Describe}";
            started = time.GetTimestamp();
            var scored = await ScorePairsAsync(tree, cancellationToken);
            var clauses = ClauseBuilder.Build(tree, scored, options.Weighting, options.WeightScale);
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
            var answer = ifTrue.Cost == ifFalse.Cost ? built.DirectAnswer : ifTrue.Cost < ifFalse.Cost;
            var (best, other) = answer ? (ifTrue, ifFalse) : (ifFalse, ifTrue);
            solveTime = time.GetElapsedTime(started);

            var margin = (double)(other.Cost - best.Cost) / problem.Scale;
            var status = margin <= options.ContestedThreshold ? ClaimStatus.Contested
                : answer != built.DirectAnswer ? ClaimStatus.Overturned
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
                Values = ValuesOf(problem, best.Assignment),
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
                new VerdictTimings(treeTime, nliTime, solveTime));
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
        var pairs = ClauseBuilder.OrderedPairs(tree);
        if (pairs.Count == 0)
        {
            return [];
        }

        var scores = await scorer.ScoreAsync([.. pairs.Select(p => new SentencePair(p.Premise.Text, p.Hypothesis.Text))], cancellationToken);
        if (scores.Count != pairs.Count)
        {
            throw new EntailmentScoringException($"the NLI scorer returned {scores.Count} results for {pairs.Count} statement pairs");
        }

        var scored = new PairScore[pairs.Count];
        for (var i = 0; i < pairs.Count; i++)
        {
            scored[i] = new PairScore(pairs[i].Premise.Id, pairs[i].Hypothesis.Id, scores[i]);
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
