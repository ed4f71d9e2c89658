namespace Plumbline.Core.Coherence;

public enum ClaimStatus
{
    /// <summary>The answer equals the direct answer and the margin is above the threshold.</summary>
    Settled,

    /// <summary>The answer differs from the direct answer and the margin is above the threshold.</summary>
    Overturned,

    /// <summary>The margin is at or below the threshold: the model's own reasoning does not decide.</summary>
    Contested,

    /// <summary>The claim could not be judged; the verdict's error says why.</summary>
    Failed,
}
