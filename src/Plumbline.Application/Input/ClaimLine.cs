using Plumbline.Core.Claims;

namespace Plumbline.Application.Input;

/// <summary>One record of a claim input: a usable claim, or the problem that makes it unusable.</summary>
/// <param name="Line">The line the record starts on (1-based).</param>
/// <param name="Claim">The claim; null when <paramref name="Problem"/> is set.</param>
/// <param name="Problem">Why the record cannot be used; null for a good one.</param>
internal readonly record struct ClaimLine(int Line, Claim? Claim, ClaimFileException? Problem)
{
    public static ClaimLine Good(int line, Claim claim) => new(line, claim, null);

    public static ClaimLine Bad(ClaimFileException problem) => new(problem.Line, null, problem);
}
