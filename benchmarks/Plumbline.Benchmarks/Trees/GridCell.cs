using System.Globalization;
using Plumbline.Core.Coherence;
using Plumbline.Core.Trees;

namespace Plumbline.Benchmarks.Trees;

/// <summary>One combination of engine settings the grid measures.</summary>
internal sealed record GridCell(CoherenceOptions Options)
{
    /// <summary>The settings that change which statement pairs the NLI model sees (so planning covers each once).</summary>
    public (double Gap, NliText Text, bool CutOff, bool Expand) PairShape =>
        (Options.IntegrityGap, Options.NliText, Options.DiscardCutOff, Options.ExpandIntegralClaim);

    /// <summary>The columns of the grid table, in the spelling of the command-line options.</summary>
    public static string Header =>
        $"{"gap",-4} {"belief-form",-21} {"floor",-5} {"conflicts",-9} {"contradictions",-14} {"claim",-5} {"nli-text",-19}";

    public string Columns =>
        string.Create(CultureInfo.InvariantCulture,
            $"{Options.IntegrityGap,-4:0.##} {Spell(Options.BeliefForm),-21} {Options.LinkFloor,-5:0.##} {Spell(Options.Conflicts),-9} {Spell(Options.Contradictions),-14} {(Options.ClaimBelief ? "on" : "off"),-5} {Spell(Options.NliText),-19}");

    /// <summary>Settings outside the grid's seven dimensions, when they differ from the engine's defaults.</summary>
    public string Extras
    {
        get
        {
            var d = CoherenceOptions.Default;
            var extras = new List<string>();
            if (Options.Weighting != d.Weighting)
            {
                extras.Add(Options.Weighting == ClauseWeighting.NliProbability ? "--weighting nli" : "--weighting unit");
            }

            if (Options.ExpandIntegralClaim != d.ExpandIntegralClaim)
            {
                extras.Add(Options.ExpandIntegralClaim ? "--integral-claim expand" : "--integral-claim stop");
            }

            if (Options.DiscardCutOff != d.DiscardCutOff)
            {
                extras.Add(Options.DiscardCutOff ? "--cut-off discard" : "--cut-off keep");
            }

            if (Options.DirectAnswer != d.DirectAnswer)
            {
                extras.Add(Options.DirectAnswer == DirectAnswerRule.Paired ? "--direct-answer paired" : "--direct-answer plain");
            }

            return string.Join(' ', extras);
        }
    }

    /// <summary>
    /// Integrity gap {0, 0.45} x belief form x link floor {0, 0.6, 0.8} x conflict rule x contradiction counting
    /// x claim belief x NLI text: 192 cells, everything else at the engine's defaults.
    /// </summary>
    public static IReadOnlyList<GridCell> Full()
    {
        var cells = new List<GridCell>();
        foreach (var gap in new[] { 0.0, 0.45 })
        foreach (var belief in new[] { BeliefForm.Ratio, BeliefForm.NormalisedDifference })
        foreach (var floor in new[] { 0.0, 0.6, 0.8 })
        foreach (var conflicts in new[] { ConflictRule.Keep, ConflictRule.Drop })
        foreach (var contradictions in new[] { ContradictionCount.EachDirection, ContradictionCount.OncePerPair })
        foreach (var claimBelief in new[] { false, true })
        foreach (var text in new[] { NliText.Statement, NliText.NegationWhenFalse })
        {
            cells.Add(new GridCell(CoherenceOptions.Default with
            {
                IntegrityGap = gap,
                BeliefForm = belief,
                LinkFloor = floor,
                Conflicts = conflicts,
                Contradictions = contradictions,
                ClaimBelief = claimBelief,
                NliText = text,
            }));
        }

        return cells;
    }

    /// <summary>
    /// The plain method the rule starts from: the flip test alone, the ratio belief, every link, conflicts kept,
    /// a clause per contradiction direction, no claim belief, every statement by its own text.
    /// </summary>
    public static CoherenceOptions PlainMethod { get; } = CoherenceOptions.Default with
    {
        IntegrityGap = 0.0,
        BeliefForm = BeliefForm.Ratio,
        LinkFloor = 0.0,
        Conflicts = ConflictRule.Keep,
        Contradictions = ContradictionCount.EachDirection,
        ClaimBelief = false,
        NliText = NliText.Statement,
    };

    /// <summary>The seven grid settings, each as its option's name and the word of its value.</summary>
    public static IReadOnlyList<(string Name, Func<CoherenceOptions, string> Level)> Dimensions { get; } =
    [
        ("--integrity-gap", o => o.IntegrityGap.ToString("0.##", CultureInfo.InvariantCulture)),
        ("--belief-form", o => Spell(o.BeliefForm)),
        ("--link-floor", o => o.LinkFloor.ToString("0.##", CultureInfo.InvariantCulture)),
        ("--conflicts", o => Spell(o.Conflicts)),
        ("--contradictions", o => Spell(o.Contradictions)),
        ("--claim-belief", o => o.ClaimBelief ? "on" : "off"),
        ("--nli-text", o => Spell(o.NliText)),
    ];

    /// <summary>The engine's defaults, then each remaining option changed alone from them.</summary>
    public static IReadOnlyList<GridCell> Variations(CoherenceOptions start) =>
    [
        new(start),
        new(start with { Weighting = start.Weighting == ClauseWeighting.Unit ? ClauseWeighting.NliProbability : ClauseWeighting.Unit }),
        new(start with { ExpandIntegralClaim = !start.ExpandIntegralClaim }),
        new(start with { DiscardCutOff = !start.DiscardCutOff }),
        new(start with { DirectAnswer = start.DirectAnswer == DirectAnswerRule.Plain ? DirectAnswerRule.Paired : DirectAnswerRule.Plain }),
    ];

    private static string Spell(BeliefForm form) => form == BeliefForm.Ratio ? "ratio" : "normalised-difference";

    private static string Spell(ConflictRule rule) => rule == ConflictRule.Keep ? "keep" : "drop";

    private static string Spell(ContradictionCount count) => count == ContradictionCount.EachDirection ? "each-direction" : "once-per-pair";

    private static string Spell(NliText text) => text == NliText.Statement ? "statement" : "negation-when-false";
}
