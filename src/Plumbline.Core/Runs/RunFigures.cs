using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;

namespace Plumbline.Core.Runs;

/// <summary>Run-level figures. Rates are over judged (not failed) claims; accuracies over judged claims with a gold label.</summary>
/// <param name="Claims">All claims in the run.</param>
/// <param name="Judged">Claims not failed.</param>
/// <param name="Settled">Claims settled.</param>
/// <param name="Overturned">Claims overturned.</param>
/// <param name="Contested">Claims contested.</param>
/// <param name="Failed">Claims that could not be judged.</param>
/// <param name="Labelled">Judged claims with a gold label.</param>
/// <param name="DirectAccuracy">Direct answer equals gold; null without labelled claims.</param>
/// <param name="CoherentAccuracy">Answer equals gold; null without labelled claims.</param>
/// <param name="OverturnRate">Overturned / judged (0 when none judged).</param>
/// <param name="ContestedRate">Contested / judged.</param>
/// <param name="TwoSidedRate">Two-sided / judged.</param>
/// <param name="MeanMargin">Mean margin of judged claims.</param>
/// <param name="EntailmentLinks">Entailment links over all claims.</param>
/// <param name="ContradictionLinks">Contradiction links over all claims.</param>
/// <param name="ModelCalls">Language model requests over all claims, failed ones included.</param>
/// <param name="Tokens">Tokens over all claims.</param>
/// <param name="WallTime">Elapsed time of the run.</param>
public sealed record RunFigures(
    int Claims,
    int Judged,
    int Settled,
    int Overturned,
    int Contested,
    int Failed,
    int Labelled,
    Proportion? DirectAccuracy,
    Proportion? CoherentAccuracy,
    double OverturnRate,
    double ContestedRate,
    double TwoSidedRate,
    double MeanMargin,
    int EntailmentLinks,
    int ContradictionLinks,
    int ModelCalls,
    TokenUsage Tokens,
    TimeSpan WallTime)
{
    /// <summary>Paired direct answer (p(claim) against p(negated claim)) equals gold; null without labelled claims.</summary>
    public Proportion? PairedDirectAccuracy { get; init; }

    /// <summary>Mean normalised margin of judged claims.</summary>
    public double MeanNormalisedMargin { get; init; }

    /// <summary>Mean share of sampled trees giving the majority answer, over judged claims; null when one tree per claim was judged.</summary>
    public double? MeanStability { get; init; }

    /// <summary>Judged claims whose sampled trees tied (no majority).</summary>
    public int StabilityTies { get; init; }

    /// <summary>Statement pairs read as entailment one way and contradiction the other, over all claims.</summary>
    public int ConflictingPairs { get; init; }

    /// <summary>Explanations dropped because they did not end a sentence, over all claims.</summary>
    public int CutOffDiscarded { get; init; }

    /// <summary>Claims whose answer probabilities were estimated by sampling rather than read from token probabilities.</summary>
    public int EstimatedClaims { get; init; }

    public static RunFigures From(IReadOnlyList<Verdict> verdicts, TimeSpan wallTime)
    {
        var judged = verdicts.Where(v => v.Status != ClaimStatus.Failed).ToList();
        var labelled = judged.Where(v => v.Claim.Gold is not null).ToList();
        int Count(ClaimStatus status) => verdicts.Count(v => v.Status == status);
        double RateOf(int count) => judged.Count == 0 ? 0.0 : (double)count / judged.Count;

        var tokens = TokenUsage.None;
        foreach (var verdict in verdicts)
        {
            tokens += verdict.Tokens;
        }

        return new RunFigures(
            Claims: verdicts.Count,
            Judged: judged.Count,
            Settled: Count(ClaimStatus.Settled),
            Overturned: Count(ClaimStatus.Overturned),
            Contested: Count(ClaimStatus.Contested),
            Failed: Count(ClaimStatus.Failed),
            Labelled: labelled.Count,
            DirectAccuracy: labelled.Count == 0 ? null : Proportion.Wilson(labelled.Count(v => v.DirectAnswer == v.Claim.Gold), labelled.Count),
            CoherentAccuracy: labelled.Count == 0 ? null : Proportion.Wilson(labelled.Count(v => v.Answer == v.Claim.Gold), labelled.Count),
            OverturnRate: RateOf(Count(ClaimStatus.Overturned)),
            ContestedRate: RateOf(Count(ClaimStatus.Contested)),
            TwoSidedRate: RateOf(judged.Count(v => v.TwoSided)),
            MeanMargin: judged.Count == 0 ? 0.0 : judged.Average(v => v.Margin),
            EntailmentLinks: verdicts.Sum(v => v.Links.Count(l => l.Kind == EntailmentKind.Entailment)),
            ContradictionLinks: verdicts.Sum(v => v.Links.Count(l => l.Kind == EntailmentKind.Contradiction)),
            ModelCalls: verdicts.Sum(v => v.ModelCalls),
            Tokens: tokens,
            WallTime: wallTime)
        {
            PairedDirectAccuracy = labelled.Count == 0 ? null : Proportion.Wilson(labelled.Count(v => v.PairedDirectAnswer == v.Claim.Gold), labelled.Count),
            MeanNormalisedMargin = judged.Count == 0 ? 0.0 : judged.Average(v => v.NormalisedMargin),
            MeanStability = judged.Any(v => v.Stability is not null) ? judged.Where(v => v.Stability is not null).Average(v => v.Stability!.Share) : null,
            StabilityTies = judged.Count(v => v.Stability is { Tied: true }),
            ConflictingPairs = verdicts.Sum(v => v.Conflicts.Count),
            CutOffDiscarded = verdicts.Sum(v => v.CutOffDiscarded),
            EstimatedClaims = verdicts.Count(v => v.ProbabilitiesEstimated),
        };
    }
}
