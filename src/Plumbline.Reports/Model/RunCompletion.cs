namespace Plumbline.Reports.Model;

/// <summary>How a run ended.</summary>
/// <param name="StoppedBecause">Why the run stopped before the end of its claims (interrupted, a budget ...); null when it did not.</param>
/// <param name="NotJudged">Ids of the claims that were read but never judged, in input order.</param>
/// <param name="Problems">What went wrong without stopping the run: skipped input lines, a failing report or export.</param>
public sealed record RunCompletion(string? StoppedBecause, IReadOnlyList<string> NotJudged, IReadOnlyList<RunProblem> Problems)
{
    public static RunCompletion Complete { get; } = new(null, [], []);

    /// <summary>True when the run reached the end and nothing went wrong on the way (failed claims aside).</summary>
    public bool IsComplete => StoppedBecause is null && NotJudged.Count == 0 && Problems.Count == 0;
}
