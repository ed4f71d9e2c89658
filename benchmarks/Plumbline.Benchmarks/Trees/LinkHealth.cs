using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;

namespace Plumbline.Benchmarks.Trees;

/// <summary>
/// Two shares that show whether the NLI model reads explanation trees sensibly, from the most likely label of
/// every scored pair (no floor), each statement by its own text:
/// among links between two kept first-level explanations written for the same answer, the share read as
/// contradiction (such explanations mostly restate or add detail, so a healthy model finds few); and among
/// links between the claim and a kept first-level explanation (either direction), the share that go against
/// the answer the explanation was written for (contradiction for one written for True, entailment for one
/// written for False).
/// </summary>
internal sealed record LinkHealth(int SameAnswerLinks, int SameAnswerContradictions, int ClaimLinks, int ClaimLinksAgainst)
{
    public static LinkHealth Of(IEnumerable<Verdict> verdicts)
    {
        int sameAnswer = 0, contradictions = 0, claimLinks = 0, against = 0;
        foreach (var verdict in verdicts)
        {
            if (verdict.Tree is not { } tree)
            {
                continue;
            }

            foreach (var pair in verdict.Pairs)
            {
                var kind = pair.Scores.Kind;
                if (kind == EntailmentKind.Neutral || pair.FromNegation || pair.ToNegation)
                {
                    continue;
                }

                var (from, to) = (tree[pair.From], tree[pair.To]);
                if (from.Depth == 1 && to.Depth == 1 && from.GeneratedFor == to.GeneratedFor)
                {
                    sameAnswer++;
                    contradictions += kind == EntailmentKind.Contradiction ? 1 : 0;
                }
                else if ((from.IsRoot && to.Depth == 1) || (to.IsRoot && from.Depth == 1))
                {
                    var explanation = from.IsRoot ? to : from;
                    claimLinks++;
                    var supports = explanation.GeneratedFor == true ? EntailmentKind.Entailment : EntailmentKind.Contradiction;
                    against += kind != supports ? 1 : 0;
                }
            }
        }

        return new LinkHealth(sameAnswer, contradictions, claimLinks, against);
    }
}
