using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Evaluation;

/// <summary>
/// Gold label spellings: the three class names in any case, or their indices 0, 1, 2 in that order as the
/// common NLI corpora number them (common practice); "-" (no annotator agreement) and -1 mark an unlabelled row.
/// </summary>
internal static class GoldLabels
{
    public const string Unlabelled = "-";

    /// <summary>Null for an unlabelled row; an exception naming file, line and field for anything unknown.</summary>
    public static EntailmentKind? Parse(string text, string file, int line, string field)
    {
        switch (text.Trim().ToLowerInvariant())
        {
            case "entailment" or "0":
                return EntailmentKind.Entailment;
            case "neutral" or "1":
                return EntailmentKind.Neutral;
            case "contradiction" or "2":
                return EntailmentKind.Contradiction;
            case Unlabelled or "-1":
                return null;
            case "":
                throw new LabelledPairFormatException(file, line, field, "missing label");
            default:
                throw new LabelledPairFormatException(file, line, field, $"unknown label '{text}'; expected entailment, neutral, contradiction or -");
        }
    }
}
