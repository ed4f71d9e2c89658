using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Trees;

namespace Plumbline.Application.Tests.Doubles;

/// <summary>
/// Judges a claim after a scripted delay: settled with the claim's gold label as both answers (true when none),
/// or by throwing what the script says. Records how many claims it judged at once.
/// </summary>
internal sealed class ScriptedJudge : IClaimJudge
{
    private readonly Lock gate = new();
    private int inFlight;

    public Func<Claim, TimeSpan> Delay { get; init; } = _ => TimeSpan.Zero;

    public Func<Claim, Exception?> Throws { get; init; } = _ => null;

    /// <summary>Called once a claim is judged, before its verdict is returned.</summary>
    public Action<Claim>? Judged { get; init; }

    public int MaxInFlight { get; private set; }

    public List<string> Started { get; } = [];

    public async Task<Verdict> JudgeAsync(Claim claim, CancellationToken cancellationToken)
    {
        lock (gate)
        {
            Started.Add(claim.Id);
            inFlight++;
            MaxInFlight = Math.Max(MaxInFlight, inFlight);
        }

        try
        {
            await Task.Delay(Delay(claim), cancellationToken);
            if (Throws(claim) is { } exception)
            {
                throw exception;
            }

            Judged?.Invoke(claim);
            return Settled(claim);
        }
        finally
        {
            lock (gate)
            {
                inFlight--;
            }
        }
    }

    /// <summary>A settled verdict on a one-statement tree.</summary>
    public static Verdict Settled(Claim claim)
    {
        var answer = claim.Gold ?? true;
        var tree = new ExplanationTree([new Statement(0, claim.Text, "Not: " + claim.Text, true, 0, null, null, 0.8, 0.2, Integrity.IntegralTrue, 0.8, true)]);
        return new Verdict(claim, answer, answer, ClaimStatus.Settled, 0.6, false, tree, [], [], SolveStatus.Optimal, 200, 1, 0, 3,
            new TokenUsage(30, 3), false, VerdictTimings.None)
        {
            Values = new Dictionary<int, bool> { [0] = answer },
        };
    }
}
