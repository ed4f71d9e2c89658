using Plumbline.Core.Claims;

namespace Plumbline.Core.Coherence;

/// <summary>Turns one claim into a verdict. The engine is the real one; a run loop needs nothing more.</summary>
public interface IClaimJudge
{
    /// <summary>A failed verdict for a known failure (model, NLI or solver); cancellation and
    /// <see cref="Runs.RunHaltedException"/> throw; any other exception is a bug.</summary>
    Task<Verdict> JudgeAsync(Claim claim, CancellationToken cancellationToken);
}
