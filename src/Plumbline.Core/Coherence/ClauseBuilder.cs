using Plumbline.Core.Entailment;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>Turns a pruned tree and the NLI scores of its statement pairs into weighted clauses.</summary>
internal static class ClauseBuilder
{
    /// <summary>Every ordered pair of distinct kept statements, premise first: the pairs the NLI model scores.</summary>
    public static IReadOnlyList<(Statement Premise, Statement Hypothesis)> OrderedPairs(ExplanationTree tree)
    {
        var kept = tree.Kept;
        var pairs = new List<(Statement, Statement)>(kept.Count * Math.Max(0, kept.Count - 1));
        foreach (var premise in kept)
        {
            foreach (var hypothesis in kept)
            {
                if (premise.Id != hypothesis.Id)
                {
                    pairs.Add((premise, hypothesis));
                }
            }
        }

        return pairs;
    }

    /// <summary>
    /// One variable per kept statement (in id order, so the root is variable 1). Belief clauses for
    /// integral leaves, consistency clauses for pairs whose most likely NLI label is entailment or
    /// contradiction. Real weights are multiplied by <paramref name="scale"/> and rounded half away from zero.
    /// </summary>
    public static BuiltClauses Build(ExplanationTree tree, IReadOnlyList<PairScore> scored, ClauseWeighting weighting, int scale)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(scale);
        ArgumentNullException.ThrowIfNull(scored);
        var kept = tree.Kept;
        var variableOf = new Dictionary<int, int>(kept.Count);
        foreach (var statement in kept)
        {
            variableOf[statement.Id] = variableOf.Count + 1;
        }

        var clauses = new List<WeightedClause>();
        var origins = new List<ClauseOrigin>();
        void Add(double weight, ClauseOrigin origin, params int[] literals)
        {
            var scaled = (long)Math.Round(weight * scale, MidpointRounding.AwayFromZero);
            // A clause that weighs nothing changes no optimum, and WCNF wants positive weights.
            if (scaled > 0)
            {
                clauses.Add(WeightedClause.Soft(scaled, literals));
                origins.Add(origin);
            }
        }

        foreach (var leaf in kept.Where(s => s.IsIntegral && !kept.Any(child => child.ParentId == s.Id)))
        {
            var variable = variableOf[leaf.Id];
            if (leaf.Integrity == Integrity.IntegralTrue)
            {
                Add(leaf.Belief, ClauseOrigin.Belief(leaf.Id), variable);
            }
            else
            {
                Add(1 - leaf.Belief, ClauseOrigin.Belief(leaf.Id), -variable);
            }
        }

        var links = new List<Link>();
        foreach (var pair in scored)
        {
            var kind = pair.Scores.Kind;
            if (kind == EntailmentKind.Neutral)
            {
                continue;
            }

            var probability = pair.Scores.ProbabilityOf(kind);
            links.Add(new Link(pair.From, pair.To, kind, probability));
            var weight = weighting == ClauseWeighting.NliProbability ? probability : 1.0;
            var (from, to) = (variableOf[pair.From], variableOf[pair.To]);
            if (kind == EntailmentKind.Entailment)
            {
                Add(weight, ClauseOrigin.Entails(pair.From, pair.To), -from, to);
            }
            else
            {
                Add(weight, ClauseOrigin.Contradicts(pair.From, pair.To), -from, -to);
            }
        }

        var problem = new CoherenceProblem(
            new MaxSatProblem(kept.Count, clauses),
            origins,
            [.. kept.Select(s => s.Id)],
            scale);
        return new BuiltClauses(problem, links);
    }
}
