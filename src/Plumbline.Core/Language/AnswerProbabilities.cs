namespace Plumbline.Core.Language;

/// <summary>
/// The model's probability mass on the answers "True" and "False" for one statement, renormalised
/// over the two. <see cref="Estimated"/> is true when the backend had no token probabilities and
/// counted sampled votes instead.
/// </summary>
public sealed record AnswerProbabilities(double True, double False, bool Estimated, TokenUsage Usage)
{
    public static AnswerProbabilities FromRaw(double pTrue, double pFalse, bool estimated = false, TokenUsage usage = default)
    {
        if (pTrue < 0 || pFalse < 0 || double.IsNaN(pTrue) || double.IsNaN(pFalse))
        {
            throw new ArgumentOutOfRangeException(nameof(pTrue), "answer probabilities must be non-negative numbers");
        }

        var sum = pTrue + pFalse;
        return sum <= 0
            ? new AnswerProbabilities(0.5, 0.5, estimated, usage)
            : new AnswerProbabilities(pTrue / sum, pFalse / sum, estimated, usage);
    }

    /// <summary>The argmax answer; ties go to False so that "no evidence" never reads as agreement.</summary>
    public bool Answer => True > False;
}
