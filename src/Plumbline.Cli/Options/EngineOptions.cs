using System.CommandLine;
using Plumbline.Core.Coherence;
using Plumbline.Core.Trees;

namespace Plumbline.Cli.Options;

/// <summary>The options that set the engine's rules; each defaults to <see cref="CoherenceOptions.Default"/>.</summary>
internal sealed class EngineOptions
{
    private static readonly CoherenceOptions Defaults = CoherenceOptions.Default;

    private readonly Choice<NegationMode> negation = new(
        "--negation",
        "How statements are negated for the integrity test: model (the model rewrites them) or prefix (\"It is not true that ...\").",
        Defaults.Negation,
        ("model", NegationMode.Model), ("prefix", NegationMode.Prefix));

    private readonly Choice<ClauseWeighting> weighting = new(
        "--weighting",
        "Weight of a link's clause: unit (1) or nli (the NLI probability).",
        Defaults.Weighting,
        ("unit", ClauseWeighting.Unit), ("nli", ClauseWeighting.NliProbability));

    private readonly Option<double> contestedAt = new("--contested-at")
    {
        Description = "A claim whose raw margin (clause weight lost by the other answer; not the normalised margin) is at or below this is contested.",
        HelpName = "MARGIN",
        DefaultValueFactory = _ => Defaults.ContestedThreshold,
    };

    private readonly Option<double> integrityGap = new("--integrity-gap")
    {
        Description = "A statement is logically integral only when its answer flips under negation and p(True) for it and for its negation differ by more than GAP (0: the flip alone).",
        HelpName = "GAP",
        DefaultValueFactory = _ => Defaults.IntegrityGap,
    };

    private readonly Choice<BeliefForm> beliefForm = new(
        "--belief-form",
        "Weight of a belief clause: ratio (the believed side's share, above 0.5) or normalised-difference (|p(T|E) - p(T|~E)| / (p(T|E) + p(T|~E)), near 0 for a barely integral statement).",
        Defaults.BeliefForm,
        ("ratio", BeliefForm.Ratio), ("normalised-difference", BeliefForm.NormalisedDifference));

    private readonly Option<double> linkFloor = new("--link-floor")
    {
        Description = "Least NLI probability of a link; a weaker entailment or contradiction counts as neutral.",
        HelpName = "P",
        DefaultValueFactory = _ => Defaults.LinkFloor,
    };

    private readonly Choice<ConflictRule> conflicts = new(
        "--conflicts",
        "A pair read as entailment one way and contradiction the other: keep both links, or drop both. Either way it is listed.",
        Defaults.Conflicts,
        ("keep", ConflictRule.Keep), ("drop", ConflictRule.Drop));

    private readonly Choice<ContradictionCount> contradictions = new(
        "--contradictions",
        "Clauses a contradiction adds: one per direction read, or one per unordered pair.",
        Defaults.Contradictions,
        ("each-direction", ContradictionCount.EachDirection), ("once-per-pair", ContradictionCount.OncePerPair));

    private readonly Choice<NliText> nliText = new(
        "--nli-text",
        "Text scored by the NLI model for an explanation the model believes false: the statement, or its negation (negation-when-false).",
        Defaults.NliText,
        ("statement", NliText.Statement), ("negation-when-false", NliText.NegationWhenFalse));

    private readonly Choice<bool> cutOff = new(
        "--cut-off",
        "Explanations that stop before a sentence end: discard (and count them) or keep.",
        Defaults.DiscardCutOff,
        ("discard", true), ("keep", false));

    private readonly Choice<bool> integralClaim = new(
        "--integral-claim",
        "A claim that is logically integral at once: expand it like any claim, or stop and answer it by its own belief.",
        Defaults.ExpandIntegralClaim,
        ("expand", true), ("stop", false));

    private readonly Choice<bool> claimBelief = new(
        "--claim-belief",
        "Add the claim's own belief (its answers for the claim and its negation) as a weighted unit clause: on or off.",
        Defaults.ClaimBelief,
        ("on", true), ("off", false));

    private readonly Choice<DirectAnswerRule> directAnswer = new(
        "--direct-answer",
        "The direct answer a status compares with: plain (p(True | claim) above 0.5) or paired (p(True | claim) above p(True | negated claim)). Both are reported.",
        Defaults.DirectAnswer,
        ("plain", DirectAnswerRule.Plain), ("paired", DirectAnswerRule.Paired));

    private readonly Option<int> samples = new("--samples")
    {
        Description = "Independently sampled trees per claim; above 1 the answer is their majority and each claim's stability is reported.",
        HelpName = "N",
        DefaultValueFactory = _ => Defaults.Samples,
    };

    public EngineOptions()
    {
        contestedAt.CustomParser = result => NumberParsing.Parse(result, "--contested-at", "a margin (a number 0 or more)", v => v >= 0);
        integrityGap.CustomParser = result => NumberParsing.Parse(result, "--integrity-gap", "a gap (a number from 0 up to, not including, 1)", v => v is >= 0 and < 1);
        linkFloor.CustomParser = result => NumberParsing.Parse(result, "--link-floor", "a probability (a number from 0 to 1)", v => v is >= 0 and <= 1);
        samples.CustomParser = result => (int)NumberParsing.Parse(result, "--samples", "a number of trees (a whole number from 1 to 100)", v => v is >= 1 and <= 100 && v == Math.Floor(v));
    }

    public void AddTo(Command command)
    {
        command.Options.Add(negation.Option);
        command.Options.Add(weighting.Option);
        command.Options.Add(contestedAt);
        command.Options.Add(integrityGap);
        command.Options.Add(beliefForm.Option);
        command.Options.Add(linkFloor);
        command.Options.Add(conflicts.Option);
        command.Options.Add(contradictions.Option);
        command.Options.Add(nliText.Option);
        command.Options.Add(cutOff.Option);
        command.Options.Add(integralClaim.Option);
        command.Options.Add(claimBelief.Option);
        command.Options.Add(directAnswer.Option);
        command.Options.Add(samples);
    }

    public CoherenceOptions Read(ParseResult parse) => Defaults with
    {
        Negation = negation.Read(parse),
        Weighting = weighting.Read(parse),
        ContestedThreshold = parse.GetValue(contestedAt),
        IntegrityGap = parse.GetValue(integrityGap),
        BeliefForm = beliefForm.Read(parse),
        LinkFloor = parse.GetValue(linkFloor),
        Conflicts = conflicts.Read(parse),
        Contradictions = contradictions.Read(parse),
        NliText = nliText.Read(parse),
        DiscardCutOff = cutOff.Read(parse),
        ExpandIntegralClaim = integralClaim.Read(parse),
        ClaimBelief = claimBelief.Read(parse),
        DirectAnswer = directAnswer.Read(parse),
        Samples = parse.GetValue(samples),
    };
}
