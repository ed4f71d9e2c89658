using Plumbline.Core.Entailment;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>Turns a pruned tree and the NLI scores of its statement pairs into weighted clauses.</summary>
internal static class ClauseBuilder
{
    /// <summary>Every ordered pair of distinct kept statements, premise first, with the text that stands for each side.</summary>
    public static IReadOnlyList<StatementPair> OrderedPairs(ExplanationTree tree, NliText nliText = NliText.Statement)
    {
        var kept = tree.Kept;
        var pairs = new List<StatementPair>(kept.Count * Math.Max(0, kept.Count - 1));
        foreach (var premise in kept)
        {
            foreach (var hypothesis in kept)
            {
                if (premise.Id != hypothesis.Id)
                {
                    pairs.Add(new StatementPair(premise, hypothesis, IsNegated(premise, nliText), IsNegated(hypothesis, nliText)));
                }
            }
        }

        return pairs;
    }

    /// <summary>
    /// One variable per kept statement (in id order, so the root is variable 1). Belief clauses for
    /// integral leaves (and for the claim when <see cref="ClauseRules.ClaimBelief"/> is set), consistency
    /// clauses for pairs whose most likely NLI label is entailment or contradiction with at least the link
    /// floor's probability. Real weights are multiplied by the scale and rounded half away from zero.
    /// </summary>
    public static BuiltClauses Build(ExplanationTree tree, IReadOnlyList<PairScore> scored, ClauseRules rules)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(rules.Scale);
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
            var scaled = (long)Math.Round(weight * rules.Scale, MidpointRounding.AwayFromZero);
            // A clause that weighs nothing changes no optimum, and WCNF wants positive weights.
            if (scaled > 0)
            {
                clauses.Add(WeightedClause.Soft(scaled, literals));
                origins.Add(origin);
            }
        }

        var leaves = kept.Where(s => s.IsIntegral && !kept.Any(child => child.ParentId == s.Id)).ToList();
        foreach (var leaf in leaves)
        {
            var variable = variableOf[leaf.Id];
            Add(leaf.BeliefWeight(rules.BeliefForm), ClauseOrigin.Belief(leaf.Id), leaf.Integrity == Integrity.IntegralTrue ? variable : -variable);
        }

        var root = tree.Root;
        if (rules.ClaimBelief && !leaves.Contains(root) && root.Belief != 0.5)
        {
            var believedTrue = root.Belief > 0.5;
            Add(Statement.BeliefWeight(root.Belief, believedTrue, rules.BeliefForm), ClauseOrigin.Belief(root.Id), believedTrue ? 1 : -1);
        }

        var (links, conflicts) = LinksOf(scored, rules);
        int Literal(int statementId, bool negated) => negated ? -variableOf[statementId] : variableOf[statementId];
        var counted = new HashSet<(int, int)>();
        foreach (var link in links)
        {
            var weight = rules.Weighting == ClauseWeighting.NliProbability ? link.Probability : 1.0;
            var (from, to) = (Literal(link.From, link.FromNegation), Literal(link.To, link.ToNegation));
            if (link.Kind == EntailmentKind.Entailment)
            {
                Add(weight, ClauseOrigin.Of(link), -from, to);
            }
            else if (rules.Contradictions == ContradictionCount.EachDirection)
            {
                Add(weight, ClauseOrigin.Of(link), -from, -to);
            }
            else if (counted.Add((Math.Min(link.From, link.To), Math.Max(link.From, link.To))))
            {
                // "Not both true" is one constraint: one clause, as strong as the pair's stronger reading.
                var reverse = links.FirstOrDefault(l => l.Kind == EntailmentKind.Contradiction && l.From == link.To && l.To == link.From);
                var pairWeight = rules.Weighting == ClauseWeighting.NliProbability && reverse is not null
                    ? Math.Max(link.Probability, reverse.Probability)
                    : weight;
                Add(pairWeight, ClauseOrigin.Of(link), -from, -to);
            }
        }

        var problem = new CoherenceProblem(
            new MaxSatProblem(kept.Count, clauses),
            origins,
            [.. kept.Select(s => s.Id)],
            rules.Scale);
        return new BuiltClauses(problem, links, conflicts);
    }

    /// <summary>A statement the model believes false stands in NLI pairs for its negation's text, when the rules say so; never the claim.</summary>
    private static bool IsNegated(Statement statement, NliText nliText) =>
        nliText == NliText.NegationWhenFalse && !statement.IsRoot && statement.Integrity == Integrity.IntegralFalse;

    /// <summary>
    /// The links the clauses come from, in pair order: the most likely label when it is not neutral and its
    /// probability reaches the floor. Pairs read as entailment one way and contradiction the other are listed
    /// as conflicts, and dropped when the rules say so.
    /// </summary>
    private static (List<Link> Links, List<LinkConflict> Conflicts) LinksOf(IReadOnlyList<PairScore> scored, ClauseRules rules)
    {
        var links = new List<Link>();
        foreach (var pair in scored)
        {
            var kind = pair.Scores.Kind;
            var probability = pair.Scores.ProbabilityOf(kind);
            if (kind != EntailmentKind.Neutral && probability >= rules.LinkFloor)
            {
                links.Add(new Link(pair.From, pair.To, kind, probability, pair.FromNegation, pair.ToNegation));
            }
        }

        var byDirection = links.ToDictionary(l => (l.From, l.To));
        var conflicts = new List<LinkConflict>();
        var dropped = new HashSet<Link>();
        foreach (var link in links.Where(l => l.Kind == EntailmentKind.Entailment))
        {
            if (byDirection.TryGetValue((link.To, link.From), out var reverse) && reverse.Kind == EntailmentKind.Contradiction)
            {
                var drop = rules.Conflicts == ConflictRule.Drop;
                conflicts.Add(new LinkConflict(link, reverse, drop));
                if (drop)
                {
                    dropped.Add(link);
                    dropped.Add(reverse);
                }
            }
        }

        return ([.. links.Where(l => !dropped.Contains(l))], conflicts);
    }
}
