using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;

namespace Plumbline.Benchmarks.Trees;

/// <summary>What one grid cell's verdicts say against the gold labels.</summary>
/// <param name="Claims">Claims judged.</param>
/// <param name="Failed">Claims that failed (none expected: every request is in the recording).</param>
/// <param name="Direct">Plain direct answer (p(claim) above 0.5) equals gold.</param>
/// <param name="PairedDirect">Paired direct answer (p(claim) against p(negated claim)) equals gold.</param>
/// <param name="Coherent">Coherent answer equals gold.</param>
/// <param name="Overturned">Claims whose coherent answer overturned the direct answer.</param>
/// <param name="OverturnedRight">Of those, the ones where the coherent answer equals gold.</param>
/// <param name="Contested">Claims whose margin was at or below the threshold.</param>
/// <param name="MeanNormalisedMargin">Mean normalised margin of judged claims.</param>
/// <param name="CallsPerClaim">Model requests per claim (what a live model would be asked).</param>
internal sealed record CellFigures(
    int Claims,
    int Failed,
    Proportion Direct,
    Proportion PairedDirect,
    Proportion Coherent,
    int Overturned,
    int OverturnedRight,
    int Contested,
    double MeanNormalisedMargin,
    double CallsPerClaim)
{
    /// <summary>Coherent minus plain direct accuracy, in percentage points.</summary>
    public double GainPoints => 100 * (Coherent.Value - Direct.Value);

    public static CellFigures Of(IReadOnlyList<Verdict> verdicts)
    {
        var figures = RunFigures.From(verdicts, TimeSpan.Zero);
        var overturned = verdicts.Where(v => v.Status == ClaimStatus.Overturned).ToList();
        return new CellFigures(
            verdicts.Count,
            figures.Failed,
            figures.DirectAccuracy ?? Proportion.Wilson(0, 0),
            figures.PairedDirectAccuracy ?? Proportion.Wilson(0, 0),
            figures.CoherentAccuracy ?? Proportion.Wilson(0, 0),
            overturned.Count,
            overturned.Count(v => v.Answer == v.Claim.Gold),
            figures.Contested,
            figures.MeanNormalisedMargin,
            verdicts.Count == 0 ? 0 : (double)figures.ModelCalls / verdicts.Count);
    }
}
