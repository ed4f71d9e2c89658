using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Trees;
using Plumbline.Reports.Model;

namespace Plumbline.Reports;

/// <summary>
/// The vocabulary's words for Core's enums, shared by every format so that the terminal, the JSON
/// and its schema never drift apart. An unknown value throws rather than invent a word.
/// </summary>
internal static class ReportWords
{
    public static string Of(ClaimStatus status) => status switch
    {
        ClaimStatus.Settled => "settled",
        ClaimStatus.Overturned => "overturned",
        ClaimStatus.Contested => "contested",
        ClaimStatus.Failed => "failed",
        _ => throw Unknown(status),
    };

    /// <summary>"true" / "false" name the answer an integral statement holds; "no" means not integral.</summary>
    public static string Of(Integrity integrity) => integrity switch
    {
        Integrity.IntegralTrue => "true",
        Integrity.IntegralFalse => "false",
        Integrity.NotIntegral => "no",
        _ => throw Unknown(integrity),
    };

    /// <summary>Only entailments and contradictions are links; a neutral one reaching a report is a bug upstream.</summary>
    public static string Of(EntailmentKind kind) => kind switch
    {
        EntailmentKind.Entailment => "entailment",
        EntailmentKind.Contradiction => "contradiction",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "a link must be an entailment or a contradiction"),
    };

    public static string Of(ClauseKind kind) => kind switch
    {
        ClauseKind.Belief => "belief",
        ClauseKind.Entailment => "entailment",
        ClauseKind.Contradiction => "contradiction",
        ClauseKind.Pin => "pin",
        _ => throw Unknown(kind),
    };

    /// <summary>The label of one direction's NLI scores, neutral included.</summary>
    public static string Label(EntailmentKind kind) => kind switch
    {
        EntailmentKind.Entailment => "entailment",
        EntailmentKind.Neutral => "neutral",
        EntailmentKind.Contradiction => "contradiction",
        _ => throw Unknown(kind),
    };

    public static string Of(PairListing listing) => listing switch
    {
        PairListing.Linked => "linked",
        PairListing.All => "all",
        _ => throw Unknown(listing),
    };

    /// <summary>"true", "false" or "none" for an answer that may be missing.</summary>
    public static string Answer(bool? answer) => answer switch
    {
        true => "true",
        false => "false",
        null => "none",
    };

    public static string Of(BeliefForm form) => form switch
    {
        BeliefForm.Ratio => "ratio",
        BeliefForm.NormalisedDifference => "normalised_difference",
        _ => throw Unknown(form),
    };

    public static string Of(ConflictRule rule) => rule switch
    {
        ConflictRule.Keep => "keep",
        ConflictRule.Drop => "drop",
        _ => throw Unknown(rule),
    };

    public static string Of(ContradictionCount count) => count switch
    {
        ContradictionCount.EachDirection => "each_direction",
        ContradictionCount.OncePerPair => "once_per_pair",
        _ => throw Unknown(count),
    };

    public static string Of(NliText text) => text switch
    {
        NliText.Statement => "statement",
        NliText.NegationWhenFalse => "negation_when_false",
        _ => throw Unknown(text),
    };

    public static string Of(DirectAnswerRule rule) => rule switch
    {
        DirectAnswerRule.Plain => "plain",
        DirectAnswerRule.Paired => "paired",
        _ => throw Unknown(rule),
    };

    public static string Of(NegationMode mode) => mode switch
    {
        NegationMode.Model => "model",
        NegationMode.Prefix => "prefix",
        _ => throw Unknown(mode),
    };

    public static string Of(ClauseWeighting weighting) => weighting switch
    {
        ClauseWeighting.Unit => "unit",
        ClauseWeighting.NliProbability => "nli_probability",
        _ => throw Unknown(weighting),
    };

    public static string Of(SolveStatus status) => status switch
    {
        SolveStatus.Optimal => "optimal",
        SolveStatus.Feasible => "feasible",
        SolveStatus.Unsatisfiable => "unsatisfiable",
        SolveStatus.Unknown => "unknown",
        _ => throw Unknown(status),
    };

    private static ArgumentOutOfRangeException Unknown<T>(T value) where T : struct, Enum =>
        new(typeof(T).Name, value, $"no report word for {typeof(T).Name} value {value}");
}
