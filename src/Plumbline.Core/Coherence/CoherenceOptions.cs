using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>Settings of the engine for one run.</summary>
/// <param name="Shape">How the explanation tree grows.</param>
/// <param name="Negation">How negations are obtained.</param>
/// <param name="Weighting">Weight of consistency clauses.</param>
/// <param name="WeightScale">Factor turning real clause weights into the solver's integers (rounded).</param>
/// <param name="ContestedThreshold">A raw margin (clause-weight units, not the normalised margin) at or below this makes the claim contested.</param>
/// <param name="PromptVersion">Version of the prompt templates, recorded in reports and request fingerprints.</param>
public sealed record CoherenceOptions(
    TreeShape Shape,
    NegationMode Negation = NegationMode.Model,
    ClauseWeighting Weighting = ClauseWeighting.Unit,
    int WeightScale = 1000,
    double ContestedThreshold = 0.0,
    string PromptVersion = PromptBook.PromptVersion)
{
    public static CoherenceOptions Default { get; } = new(TreeShape.Default);

    /// <summary>
    /// A statement is integral only when, besides the answer flipping under negation, p(True | E) and
    /// p(True | ~E) differ by more than this. 0 keeps the plain flip test.
    /// </summary>
    public double IntegrityGap { get; init; }

    /// <summary>How a belief becomes a unit clause's weight.</summary>
    public BeliefForm BeliefForm { get; init; } = BeliefForm.Ratio;

    /// <summary>
    /// A link needs at least this NLI probability for its kind; weaker readings count as neutral. The defaults of
    /// this and of <see cref="Conflicts"/>, <see cref="NliText"/> and <see cref="ClaimBelief"/> were chosen on the
    /// CSQA2 trees benchmark by the rule in docs/engine-settings.md, with the default NLI model.
    /// </summary>
    public double LinkFloor { get; init; } = 0.6;

    /// <summary>What happens to a pair read as entailment one way and contradiction the other.</summary>
    public ConflictRule Conflicts { get; init; } = ConflictRule.Drop;

    /// <summary>Whether a contradiction adds a clause per direction or one per unordered pair.</summary>
    public ContradictionCount Contradictions { get; init; } = ContradictionCount.EachDirection;

    /// <summary>Which text stands for a statement in NLI pairs.</summary>
    public NliText NliText { get; init; } = NliText.NegationWhenFalse;

    /// <summary>Explanations that do not end a sentence (cut off by the token limit) are dropped and counted.</summary>
    public bool DiscardCutOff { get; init; } = true;

    /// <summary>False: a claim that is integral at once is not explained further and is answered by its own belief.</summary>
    public bool ExpandIntegralClaim { get; init; } = true;

    /// <summary>Adds the claim's own belief (its answer probabilities for the claim and its negation) as a unit clause.</summary>
    public bool ClaimBelief { get; init; } = true;

    /// <summary>Which direct answer the status and a tie compare with.</summary>
    public DirectAnswerRule DirectAnswer { get; init; } = DirectAnswerRule.Plain;

    /// <summary>Independently sampled trees per claim; above 1 the answer is their majority and stability is reported.</summary>
    public int Samples { get; init; } = 1;

    /// <summary>Every problem with the settings, empty when they can work.</summary>
    public IReadOnlyList<string> Problems()
    {
        var problems = new List<string>();
        if (Shape.Levels.Count == 0 || Shape.Levels.Any(l => l.Width < 1))
        {
            problems.Add("the tree shape needs at least one level, each of width 1 or more");
        }

        if (WeightScale < 1)
        {
            problems.Add("the weight scale must be 1 or more");
        }

        if (!(IntegrityGap >= 0 && IntegrityGap < 1))
        {
            problems.Add("the integrity gap must be at least 0 and below 1");
        }

        if (!(LinkFloor >= 0 && LinkFloor <= 1))
        {
            problems.Add("the link floor must be between 0 and 1");
        }

        if (Samples < 1)
        {
            problems.Add("the number of sampled trees must be 1 or more");
        }

        if (!(ContestedThreshold >= 0))
        {
            problems.Add("the contested threshold must be 0 or more");
        }

        return problems;
    }
}
