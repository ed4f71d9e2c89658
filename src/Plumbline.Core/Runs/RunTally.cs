using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;

namespace Plumbline.Core.Runs;

/// <summary>
/// Folds verdicts into run figures one at a time, keeping only counts and sums, so a run's memory does not
/// grow with its claim file. Not thread-safe: one run loop adds verdicts in order.
/// </summary>
public sealed class RunTally
{
    private int claims, judged, settled, overturned, contested, failed, twoSided;
    private int labelled, directCorrect, coherentCorrect;
    private int entailmentLinks, contradictionLinks, modelCalls;
    private double marginSum, normalisedMarginSum, stabilitySum;
    private int pairedDirectCorrect, stabilityMeasured, stabilityTies, conflictingPairs, cutOffDiscarded, estimatedClaims;
    private TokenUsage tokens = TokenUsage.None;

    /// <summary>Claims added so far.</summary>
    public int Claims => claims;

    /// <summary>Failed claims added so far.</summary>
    public int Failed => failed;

    public void Add(Verdict verdict)
    {
        ArgumentNullException.ThrowIfNull(verdict);
        claims++;
        modelCalls += verdict.ModelCalls;
        tokens += verdict.Tokens;
        conflictingPairs += verdict.Conflicts.Count;
        cutOffDiscarded += verdict.CutOffDiscarded;
        estimatedClaims += verdict.ProbabilitiesEstimated ? 1 : 0;
        foreach (var link in verdict.Links)
        {
            if (link.Kind == EntailmentKind.Entailment)
            {
                entailmentLinks++;
            }
            else if (link.Kind == EntailmentKind.Contradiction)
            {
                contradictionLinks++;
            }
        }

        switch (verdict.Status)
        {
            case ClaimStatus.Failed:
                failed++;
                return;
            case ClaimStatus.Settled:
                settled++;
                break;
            case ClaimStatus.Overturned:
                overturned++;
                break;
            case ClaimStatus.Contested:
                contested++;
                break;
        }

        judged++;
        marginSum += verdict.Margin;
        normalisedMarginSum += verdict.NormalisedMargin;
        if (verdict.Stability is { } stability)
        {
            stabilityMeasured++;
            stabilitySum += stability.Share;
            stabilityTies += stability.Tied ? 1 : 0;
        }

        if (verdict.TwoSided)
        {
            twoSided++;
        }

        if (verdict.Claim.Gold is { } gold)
        {
            labelled++;
            directCorrect += verdict.DirectAnswer == gold ? 1 : 0;
            coherentCorrect += verdict.Answer == gold ? 1 : 0;
            pairedDirectCorrect += verdict.PairedDirectAnswer == gold ? 1 : 0;
        }
    }

    /// <summary>The figures of the verdicts added so far.</summary>
    public RunFigures ToFigures(TimeSpan wallTime)
    {
        double RateOf(int count) => judged == 0 ? 0.0 : (double)count / judged;
        return new RunFigures(
            Claims: claims,
            Judged: judged,
            Settled: settled,
            Overturned: overturned,
            Contested: contested,
            Failed: failed,
            Labelled: labelled,
            DirectAccuracy: labelled == 0 ? null : Proportion.Wilson(directCorrect, labelled),
            CoherentAccuracy: labelled == 0 ? null : Proportion.Wilson(coherentCorrect, labelled),
            OverturnRate: RateOf(overturned),
            ContestedRate: RateOf(contested),
            TwoSidedRate: RateOf(twoSided),
            MeanMargin: judged == 0 ? 0.0 : marginSum / judged,
            EntailmentLinks: entailmentLinks,
            ContradictionLinks: contradictionLinks,
            ModelCalls: modelCalls,
            Tokens: tokens,
            WallTime: wallTime)
        {
            PairedDirectAccuracy = labelled == 0 ? null : Proportion.Wilson(pairedDirectCorrect, labelled),
            MeanNormalisedMargin = judged == 0 ? 0.0 : normalisedMarginSum / judged,
            MeanStability = stabilityMeasured == 0 ? null : stabilitySum / stabilityMeasured,
            StabilityTies = stabilityTies,
            ConflictingPairs = conflictingPairs,
            CutOffDiscarded = cutOffDiscarded,
            EstimatedClaims = estimatedClaims,
        };
    }
}
