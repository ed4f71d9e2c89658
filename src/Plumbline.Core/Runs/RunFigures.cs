using Plumbline.Core.Coherence;
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

    /// <summary>The figures of a list of verdicts (a <see cref="RunTally"/> over them).</summary>
    public static RunFigures From(IEnumerable<Verdict> verdicts, TimeSpan wallTime)
    {
        ArgumentNullException.ThrowIfNull(verdicts);
        var tally = new RunTally();
        foreach (var verdict in verdicts)
        {
            tally.Add(verdict);
        }

        return tally.ToFigures(wallTime);
    }
}
