using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;

namespace Plumbline.Core.Runs;

/// <summary>
/// What one claim adds to the run figures. A verdict gives one; so does a claim's entry read back from a report,
/// which lets a merge of shard reports recompute the figures the unsharded run would have shown.
/// </summary>
public sealed record ClaimTally(
    ClaimStatus Status,
    bool? Gold,
    bool? Answer,
    bool? DirectAnswer,
    bool? PairedDirectAnswer,
    double Margin,
    double NormalisedMargin,
    bool TwoSided,
    SampleAgreement? Stability,
    int EntailmentLinks,
    int ContradictionLinks,
    int Conflicts,
    int CutOffDiscarded,
    bool ProbabilitiesEstimated,
    int ModelCalls,
    TokenUsage Tokens)
{
    public static ClaimTally Of(Verdict verdict)
    {
        ArgumentNullException.ThrowIfNull(verdict);
        return new ClaimTally(
            verdict.Status,
            verdict.Claim.Gold,
            verdict.Answer,
            verdict.DirectAnswer,
            verdict.PairedDirectAnswer,
            verdict.Margin,
            verdict.NormalisedMargin,
            verdict.TwoSided,
            verdict.Stability,
            verdict.Links.Count(l => l.Kind == EntailmentKind.Entailment),
            verdict.Links.Count(l => l.Kind == EntailmentKind.Contradiction),
            verdict.Conflicts.Count,
            verdict.CutOffDiscarded,
            verdict.ProbabilitiesEstimated,
            verdict.ModelCalls,
            verdict.Tokens);
    }
}
