namespace Plumbline.Core.Coherence;

/// <summary>Weight of the consistency clause a link adds.</summary>
public enum ClauseWeighting
{
    /// <summary>Every link weighs 1, as strong as a fully confident belief.</summary>
    Unit,

    /// <summary>A link weighs the NLI probability of its kind.</summary>
    NliProbability,
}
