namespace Plumbline.Core.Coherence;

/// <summary>How often independently sampled trees of one claim gave the majority answer.</summary>
/// <param name="Trees">Trees judged.</param>
/// <param name="Agreeing">Trees whose answer is the majority answer (the verdict's answer).</param>
/// <param name="Tied">No majority: as many trees answered true as false.</param>
public sealed record SampleAgreement(int Trees, int Agreeing, bool Tied)
{
    /// <summary>The share of trees that give the majority answer, in [0.5, 1].</summary>
    public double Share => Trees == 0 ? 0.0 : (double)Agreeing / Trees;
}
