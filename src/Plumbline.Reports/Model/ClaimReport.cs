using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;

namespace Plumbline.Reports.Model;

/// <summary>Everything a report shows about one claim: the verdict and the reasoning behind it.</summary>
/// <param name="Id">The claim's id.</param>
/// <param name="Text">The claim as written.</param>
/// <param name="Gold">Its gold label, if the input had one.</param>
/// <param name="Tags">Its tags.</param>
/// <param name="Answer">The coherent answer; null when failed.</param>
/// <param name="DirectAnswer">The model's direct answer; null when that failed.</param>
/// <param name="Status">Settled, overturned, contested or failed.</param>
/// <param name="Margin">Clause weight lost if the claim took the other value.</param>
/// <param name="TwoSided">The model wrote integral explanations for both answers.</param>
/// <param name="ProbabilitiesEstimated">Answer probabilities were estimated by sampling.</param>
/// <param name="Statements">Every statement of the tree, pruned ones included, in id order.</param>
/// <param name="Links">Every link (directed entailment or contradiction between kept statements).</param>
/// <param name="Pairs">Statement pairs, each unordered pair once with both directions' scores (see <see cref="Model.PairListing"/>).</param>
/// <param name="Falsified">Soft clauses the optimum breaks.</param>
/// <param name="Deciding">Soft clauses the best assignment with the other answer breaks and the optimum keeps, heaviest first: what decided the answer.</param>
/// <param name="SolveStatus">The weaker status of the two solves; null when no solve happened.</param>
/// <param name="ObjectiveCost">Scaled cost of the optimum.</param>
/// <param name="IntegralCount">Statements that passed the integrity test.</param>
/// <param name="PrunedCount">Statements removed by pruning.</param>
/// <param name="ModelCalls">Model requests for this claim.</param>
/// <param name="Tokens">Tokens those requests used.</param>
/// <param name="Timings">Time spent on the tree, the NLI scoring and the solves.</param>
/// <param name="Error">Why the claim failed; null otherwise.</param>
public sealed record ClaimReport(
    string Id,
    string Text,
    bool? Gold,
    IReadOnlyList<string> Tags,
    bool? Answer,
    bool? DirectAnswer,
    ClaimStatus Status,
    double Margin,
    bool TwoSided,
    bool ProbabilitiesEstimated,
    IReadOnlyList<StatementReport> Statements,
    IReadOnlyList<Link> Links,
    IReadOnlyList<PairReport> Pairs,
    IReadOnlyList<FalsifiedClause> Falsified,
    IReadOnlyList<FalsifiedClause> Deciding,
    SolveStatus? SolveStatus,
    long? ObjectiveCost,
    int IntegralCount,
    int PrunedCount,
    int ModelCalls,
    TokenUsage Tokens,
    VerdictTimings Timings,
    string? Error)
{
    /// <summary>The direct answer comparing p(True | claim) with p(True | negated claim); null when unknown.</summary>
    public bool? PairedDirectAnswer { get; init; }

    /// <summary>The margin divided by the claim's total soft-clause weight, in [0, 1].</summary>
    public double NormalisedMargin { get; init; }

    /// <summary>Statement pairs the NLI model read as entailment one way and contradiction the other.</summary>
    public IReadOnlyList<LinkConflict> Conflicts { get; init; } = [];

    /// <summary>Explanations dropped because they did not end a sentence.</summary>
    public int CutOffDiscarded { get; init; }

    /// <summary>Agreement of independently sampled trees; null when one tree was judged.</summary>
    public SampleAgreement? Stability { get; init; }

    /// <summary>The answer disagrees with the gold label (false when either is missing).</summary>
    public bool DisagreesWithGold => Gold is { } gold && Answer is { } answer && gold != answer;

    /// <summary>The statement with <paramref name="id"/>, or null.</summary>
    public StatementReport? Statement(int id) => id >= 0 && id < Statements.Count && Statements[id].Id == id
        ? Statements[id]
        : Statements.FirstOrDefault(s => s.Id == id);
}
