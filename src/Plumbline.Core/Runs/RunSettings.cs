using Plumbline.Core.Coherence;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Runs;

/// <summary>The settings a run actually used, as recorded in its report.</summary>
/// <param name="ModelSource">The language model's description (backend and model name).</param>
/// <param name="NliModel">The NLI model's description (id and file hash).</param>
/// <param name="Shape">Tree shape.</param>
/// <param name="Negation">Negation mode.</param>
/// <param name="ContestedThreshold">Margin at or below which a claim is contested.</param>
/// <param name="Weighting">Consistency clause weighting.</param>
/// <param name="WeightScale">Integer weight scale given to the solver.</param>
/// <param name="Seed">Sampling seed, when the backend takes one.</param>
/// <param name="PromptVersion">Version of the prompt templates.</param>
/// <param name="Solver">The MAX-SAT solver's description.</param>
public sealed record RunSettings(
    string ModelSource,
    string NliModel,
    TreeShape Shape,
    NegationMode Negation,
    double ContestedThreshold,
    ClauseWeighting Weighting,
    int WeightScale,
    int? Seed,
    string PromptVersion,
    string Solver)
{
    /// <summary>Least |p(True | E) - p(True | ~E)| for integrity.</summary>
    public double IntegrityGap { get; init; }

    public BeliefForm BeliefForm { get; init; }

    /// <summary>Least NLI probability of a link.</summary>
    public double LinkFloor { get; init; }

    public ConflictRule Conflicts { get; init; }

    public ContradictionCount Contradictions { get; init; }

    public NliText NliText { get; init; }

    public bool DiscardCutOff { get; init; }

    public bool ExpandIntegralClaim { get; init; } = true;

    public bool ClaimBelief { get; init; }

    public DirectAnswerRule DirectAnswer { get; init; }

    /// <summary>Sampled trees per claim.</summary>
    public int Samples { get; init; } = 1;

    /// <summary>Settings from the engine's options and the descriptions of the parts in use.</summary>
    public static RunSettings From(CoherenceOptions options, string modelSource, string nliModel, string solver, int? seed) =>
        new(modelSource, nliModel, options.Shape, options.Negation, options.ContestedThreshold,
            options.Weighting, options.WeightScale, seed, options.PromptVersion, solver)
        {
            IntegrityGap = options.IntegrityGap,
            BeliefForm = options.BeliefForm,
            LinkFloor = options.LinkFloor,
            Conflicts = options.Conflicts,
            Contradictions = options.Contradictions,
            NliText = options.NliText,
            DiscardCutOff = options.DiscardCutOff,
            ExpandIntegralClaim = options.ExpandIntegralClaim,
            ClaimBelief = options.ClaimBelief,
            DirectAnswer = options.DirectAnswer,
            Samples = options.Samples,
        };
}
