namespace Plumbline.Nli.Evaluation;

/// <summary>
/// Where premise, hypothesis and label sit in a row, found by field name: premise or sentence1, hypothesis or
/// sentence2, gold_label (preferred, as corpora that also keep per-annotator labels name it) or label.
/// </summary>
internal sealed record PairColumns(string Premise, string Hypothesis, string Label)
{
    private static readonly string[] PremiseNames = ["premise", "sentence1"];
    private static readonly string[] HypothesisNames = ["hypothesis", "sentence2"];
    private static readonly string[] LabelNames = ["gold_label", "label"];

    /// <summary>The field names as the file spells them; null for a role no field plays.</summary>
    public static (string? Premise, string? Hypothesis, string? Label) Find(IEnumerable<string> names)
    {
        var byLowerCase = names.GroupBy(name => name.Trim().ToLowerInvariant()).ToDictionary(group => group.Key, group => group.First());
        string? Pick(string[] candidates) => candidates.Select(candidate => byLowerCase.GetValueOrDefault(candidate)).FirstOrDefault(found => found is not null);
        return (Pick(PremiseNames), Pick(HypothesisNames), Pick(LabelNames));
    }

    /// <summary>Requires all three roles; a missing one is reported against the header line.</summary>
    public static PairColumns Require(IReadOnlyList<string> header, string file)
    {
        var (premise, hypothesis, label) = Find(header);
        return new PairColumns(
            premise ?? throw Missing(file, "premise", PremiseNames),
            hypothesis ?? throw Missing(file, "hypothesis", HypothesisNames),
            label ?? throw Missing(file, "label", LabelNames));
    }

    private static LabelledPairFormatException Missing(string file, string role, string[] names) =>
        new(file, 1, role, $"header has no {string.Join(" or ", names)} column");
}
