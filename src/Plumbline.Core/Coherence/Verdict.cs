using System.Text.Json.Serialization;
using Plumbline.Core.Claims;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>Everything the engine found out about one claim.</summary>
/// <param name="Claim">The claim judged.</param>
/// <param name="Answer">The coherent answer (the claim's value in the MAX-SAT optimum, or the majority over sampled trees); null when failed.</param>
/// <param name="DirectAnswer">What the model answers when simply asked (p(True | claim) above 0.5); null when that failed.</param>
/// <param name="Status">Settled, overturned, contested or failed.</param>
/// <param name="Margin">Extra clause weight lost if the claim took the other value (scaled cost difference / scale).</param>
/// <param name="TwoSided">The kept explanations of the claim include integral ones written for True and for False.</param>
/// <param name="Tree">All statements, pruned ones included; null when the tree could not be built.</param>
/// <param name="Links">Entailments and contradictions among kept statements that became clauses.</param>
/// <param name="Falsified">Soft clauses the optimum breaks.</param>
/// <param name="SolveStatus">Optimal when both solves (claim true, claim false) proved optimality, else the weaker status; null when no solve happened.</param>
/// <param name="ObjectiveCost">Scaled cost of the optimum, as an exported WCNF's optimum; null when no solve happened.</param>
/// <param name="IntegralCount">Statements (root included) that passed the integrity test.</param>
/// <param name="PrunedCount">Statements removed by pruning.</param>
/// <param name="ModelCalls">Language model requests made for this claim.</param>
/// <param name="Tokens">Tokens those requests used, as the backend reported them.</param>
/// <param name="ProbabilitiesEstimated">True when the backend estimated answer probabilities by sampling.</param>
/// <param name="Timings">Time spent building the tree, scoring pairs and solving.</param>
/// <param name="Error">Why the claim failed; null otherwise.</param>
/// <param name="Problem">The MAX-SAT problem, for WCNF export; not part of the report itself.</param>
public sealed record Verdict(
    Claim Claim,
    bool? Answer,
    bool? DirectAnswer,
    ClaimStatus Status,
    double Margin,
    bool TwoSided,
    ExplanationTree? Tree,
    IReadOnlyList<Link> Links,
    IReadOnlyList<FalsifiedClause> Falsified,
    SolveStatus? SolveStatus,
    long? ObjectiveCost,
    int IntegralCount,
    int PrunedCount,
    int ModelCalls,
    TokenUsage Tokens,
    bool ProbabilitiesEstimated,
    VerdictTimings Timings,
    string? Error = null,
    [property: JsonIgnore] CoherenceProblem? Problem = null)
{
    /// <summary>
    /// The direct answer that compares p(True | claim) with p(True | negated claim) instead of with 0.5
    /// (a tie gives <see cref="DirectAnswer"/>); null when the claim's answers are unknown.
    /// </summary>
    public bool? PairedDirectAnswer { get; init; }

    /// <summary>
    /// <see cref="Margin"/> divided by the total weight of the claim's soft clauses, in [0, 1], so that
    /// margins of trees of different sizes can be compared and averaged; 0 when there are no clauses.
    /// </summary>
    public double NormalisedMargin { get; init; }

    /// <summary>Every ordered pair of kept statements with its NLI scores; empty when scoring did not happen.</summary>
    public IReadOnlyList<PairScore> Pairs { get; init; } = [];

    /// <summary>The truth value of every kept statement in the chosen optimum, by statement id; empty when no solve happened.</summary>
    public IReadOnlyDictionary<int, bool> Values { get; init; } = new Dictionary<int, bool>();

    /// <summary>Statement pairs read as entailment one way and contradiction the other.</summary>
    public IReadOnlyList<LinkConflict> Conflicts { get; init; } = [];

    /// <summary>Explanations dropped because they did not end a sentence (over all sampled trees).</summary>
    public int CutOffDiscarded { get; init; }

    /// <summary>Agreement of independently sampled trees; null when one tree was judged.</summary>
    public SampleAgreement? Stability { get; init; }

    /// <summary>
    /// Soft clauses broken by the best assignment that gives the claim the other answer. Those it breaks and the
    /// optimum keeps are what decided the answer; empty when no solve happened.
    /// </summary>
    public IReadOnlyList<FalsifiedClause> FalsifiedWithOtherAnswer { get; init; } = [];

    [JsonIgnore]
    public bool Overturned => Status == ClaimStatus.Overturned;

    [JsonIgnore]
    public bool IsFailed => Status == ClaimStatus.Failed;

    /// <summary>A verdict for a claim that could not be judged; whatever was learned before the failure is kept.</summary>
    public static Verdict Failed(
        Claim claim,
        string error,
        ExplanationTree? tree = null,
        bool? directAnswer = null,
        int modelCalls = 0,
        TokenUsage tokens = default,
        VerdictTimings? timings = null) =>
        new(claim, null, directAnswer, ClaimStatus.Failed, 0.0, false, tree, [], [], null, null,
            tree?.Statements.Count(s => s.IsIntegral) ?? 0,
            tree?.Statements.Count(s => !s.Kept) ?? 0,
            modelCalls, tokens, false, timings ?? VerdictTimings.None, error);
}
