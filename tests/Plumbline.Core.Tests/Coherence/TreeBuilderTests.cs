using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.Tests.Doubles;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Tests.Coherence;

public sealed class TreeBuilderTests
{
    private static readonly TreeShape OneLevel = new([new LevelShape(1, Decoding.Greedy())]);

    [Fact]
    public async Task BuildAsync_DefaultShapeNoExplanationIntegral_ThreePlusThreeThenOnePlusOnePerParent()
    {
        // Depth-1 statements never flip under negation, so each is expanded; depth-2 ones do.
        var model = ScriptedModel.Growing(s => s.StartsWith("Not: ", StringComparison.Ordinal)
            ? (s.Count(c => c == '/') == 2 ? 0.1 : 0.9)
            : 0.9);

        var built = await new TreeBuilder(model, TreeShape.Default, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None);
        var statements = built.Tree.Statements;

        Assert.Equal(6, statements.Count(s => s.Depth == 1));
        Assert.Equal(12, statements.Count(s => s.Depth == 2));
        Assert.Equal(18, statements.Count - 1);
        Assert.Equal(TreeShape.Default.MaxStatements, statements.Count - 1);
        foreach (var parent in statements.Where(s => s.Depth == 1))
        {
            var children = built.Tree.ChildrenOf(parent.Id).ToList();
            Assert.Single(children, c => c.GeneratedFor == true);
            Assert.Single(children, c => c.GeneratedFor == false);
            Assert.Equal(Integrity.NotIntegral, parent.Integrity);
        }

        Assert.All(statements.Where(s => s.Depth == 2), s => Assert.Equal(Integrity.IntegralTrue, s.Integrity));
        Assert.All(statements, s => Assert.True(s.Kept));
        Assert.Equal(Enumerable.Range(0, 19), statements.Select(s => s.Id));

        var abductions = model.Generations.Where(g => g.Purpose == GenerationPurpose.Abduction).ToList();
        var depth1 = abductions.Where(g => g.Subject == "Claim").ToList();
        Assert.Equal(2, depth1.Count);
        Assert.All(depth1, g => Assert.Equal((3, 1.0, 1.0, false), (g.Count, g.Decoding.TopP, g.Decoding.Temperature, g.Decoding.IsGreedy)));
        var depth2 = abductions.Where(g => g.Subject != "Claim").ToList();
        Assert.Equal(12, depth2.Count);
        Assert.All(depth2, g => Assert.Equal((1, true), (g.Count, g.Decoding.IsGreedy)));
    }

    [Fact]
    public async Task BuildAsync_SampleIndex_OnlySampledAbductionsCarryIt()
    {
        var model = ScriptedModel.Growing(s => s.StartsWith("Not: ", StringComparison.Ordinal)
            ? (s.Count(c => c == '/') == 2 ? 0.1 : 0.9)
            : 0.9);

        await new TreeBuilder(model, TreeShape.Default, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None, sampleIndex: 2);

        // Depth 1 samples (temperature 1.0): index 2. Depth 2 and negations are greedy: index 0.
        Assert.Equal(2, model.Generations.Count(g => g.SampleIndex == 2));
        Assert.All(model.Generations.Where(g => g.SampleIndex == 2), g => Assert.Equal("Claim", g.Subject));
        Assert.Equal(12 + 19, model.Generations.Count(g => g.SampleIndex == 0));
    }

    [Fact]
    public async Task BuildAsync_IntegralExplanation_IsNotExpanded()
    {
        var model = new ScriptedModel();
        model.Explanations[("Claim", true)] = ["Integral."];
        model.Explanations[("Claim", false)] = ["Wobbly."];
        model.Explanations[("Wobbly.", true)] = ["Deep."];
        model.PTrue["Claim"] = 0.5;
        model.PTrue["Not: Claim"] = 0.5;
        model.PTrue["Integral."] = 0.9;
        model.PTrue["Not: Integral."] = 0.1;
        model.PTrue["Wobbly."] = 0.9;
        model.PTrue["Not: Wobbly."] = 0.9;
        model.PTrue["Deep."] = 0.2;
        model.PTrue["Not: Deep."] = 0.7;
        var shape = new TreeShape([new LevelShape(1, Decoding.Greedy()), new LevelShape(1, Decoding.Greedy())]);

        var built = await new TreeBuilder(model, shape, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(["Claim", "Integral.", "Wobbly.", "Deep."], built.Tree.Statements.Select(s => s.Text));
        Assert.DoesNotContain(model.Generations, g => g.Subject == "Integral." && g.Purpose == GenerationPurpose.Abduction);
        Assert.Equal(2, built.Tree[3].ParentId);
        Assert.Equal(Integrity.IntegralFalse, built.Tree[3].Integrity);
    }

    [Theory]
    // |0.6 - 0.4| = 0.2: integral with no gap, so it is a leaf; not with a gap of 0.45, so it is explained further.
    [InlineData(0.0, Integrity.IntegralTrue, false)]
    [InlineData(0.45, Integrity.NotIntegral, true)]
    [InlineData(0.19, Integrity.IntegralTrue, false)]
    public async Task BuildAsync_IntegrityGap_SmallGapStatementIsExpanded(double gap, Integrity expected, bool expanded)
    {
        var model = new ScriptedModel();
        model.Explanations[("Claim", true)] = ["Weak."];
        model.Explanations[("Weak.", true)] = ["Deeper."];
        model.PTrue["Claim"] = 0.9;
        model.PTrue["Not: Claim"] = 0.05;
        model.PTrue["Weak."] = 0.6;
        model.PTrue["Not: Weak."] = 0.4;
        model.PTrue["Deeper."] = 0.95;
        model.PTrue["Not: Deeper."] = 0.05;
        var shape = new TreeShape([new LevelShape(1, Decoding.Greedy()), new LevelShape(1, Decoding.Greedy())]);

        var built = await new TreeBuilder(model, shape, NegationMode.Model, TreeRules.Plain with { IntegrityGap = gap })
            .BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(expected, built.Tree[1].Integrity);
        Assert.Equal(expanded, model.Generations.Any(g => g.Subject == "Weak." && g.Purpose == GenerationPurpose.Abduction));
        Assert.Equal(expanded ? 3 : 2, built.Tree.Statements.Count);
        // The claim (0.9 against 0.05) clears every gap here.
        Assert.Equal(Integrity.IntegralTrue, built.Tree.Root.Integrity);
    }

    [Fact]
    public async Task BuildAsync_DiscardCutOff_UnfinishedExplanationDroppedAndCountedWithoutRequests()
    {
        var model = new ScriptedModel { PTrueWith = s => s.StartsWith("Not: ", StringComparison.Ordinal) ? 0.2 : 0.7 };
        model.Explanations[("Claim", true)] = ["Kettles boil water.", "Kettles are made of", "The claim."];
        model.Explanations[("Claim", false)] = ["No (see above)."];
        var shape = new TreeShape([new LevelShape(3, Decoding.Sampling())]);

        var built = await new TreeBuilder(model, shape, NegationMode.Model, TreeRules.Plain with { DiscardCutOff = true })
            .BuildAsync("Claim", new CallMeter(), CancellationToken.None);
        var kept = await new TreeBuilder(ScriptedCopy(model), shape, NegationMode.Model)
            .BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(["Claim", "Kettles boil water.", "The claim.", "No (see above)."], built.Tree.Statements.Select(s => s.Text));
        Assert.Equal(1, built.CutOffDiscarded);
        Assert.DoesNotContain(model.Answers, a => a.Statement.Contains("made of", StringComparison.Ordinal));
        Assert.Equal(5, kept.Tree.Statements.Count);
        Assert.Equal(0, kept.CutOffDiscarded);
    }

    [Theory]
    [InlineData("The kettle boils.", true)]
    [InlineData("Does it boil?", true)]
    [InlineData("It boils!", true)]
    [InlineData("He said \"it boils.\"", true)]
    [InlineData("It boils (mostly.)", true)]
    [InlineData("It boils\u2026", true)]
    [InlineData("The kettle boils because the", false)]
    [InlineData("The kettle boils,", false)]
    [InlineData("", false)]
    public void EndsSentence_Text_TrueOnlyForAFinishedSentence(string text, bool expected) =>
        Assert.Equal(expected, TreeBuilder.EndsSentence(text));

    [Theory]
    [InlineData(true, 3)]
    [InlineData(false, 1)]
    public async Task BuildAsync_IntegralClaimNotExpanded_TreeIsTheClaimAlone(bool expand, int statements)
    {
        var model = new ScriptedModel { PTrueWith = s => s.StartsWith("Not: ", StringComparison.Ordinal) ? 0.2 : 0.7 };
        model.Explanations[("Claim", true)] = ["For."];
        model.Explanations[("Claim", false)] = ["Against."];

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Model, TreeRules.Plain with { ExpandIntegralClaim = expand })
            .BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(statements, built.Tree.Statements.Count);
        Assert.Equal(expand, model.Generations.Any(g => g.Purpose == GenerationPurpose.Abduction));
    }

    [Fact]
    public async Task BuildAsync_NonIntegralClaimWithExpansionOff_StillExpanded()
    {
        var model = new ScriptedModel { PTrueWith = _ => 0.7 };
        model.Explanations[("Claim", true)] = ["For."];

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Model, TreeRules.Plain with { ExpandIntegralClaim = false })
            .BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(["Claim", "For."], built.Tree.Statements.Select(s => s.Text));
    }

    [Theory]
    // plain: p(claim) > 0.5; paired: p(claim) against p(negated claim), a tie falling back to plain.
    [InlineData(0.45, 0.3, false, true)]
    [InlineData(0.6, 0.7, true, false)]
    [InlineData(0.6, 0.6, true, true)]
    [InlineData(0.4, 0.4, false, false)]
    public async Task BuildAsync_ClaimProbabilities_PlainAndPairedDirectAnswers(double pClaim, double pNegated, bool plain, bool paired)
    {
        var model = new ScriptedModel();
        model.PTrue["Claim"] = pClaim;
        model.PTrue["Not: Claim"] = pNegated;

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal((plain, paired), (built.DirectAnswer, built.PairedDirectAnswer));
    }

    [Theory]
    [InlineData(0.8, 0.3, Integrity.IntegralTrue)]
    [InlineData(0.2, 0.9, Integrity.IntegralFalse)]
    [InlineData(0.8, 0.7, Integrity.NotIntegral)]
    [InlineData(0.2, 0.1, Integrity.NotIntegral)]
    public async Task BuildAsync_AnswersForStatementAndNegation_GiveIntegrity(double pTrue, double pTrueOfNegation, Integrity expected)
    {
        var model = new ScriptedModel();
        model.Explanations[("Claim", true)] = ["Because so."];
        model.PTrue["Claim"] = 0.6;
        model.PTrue["Not: Claim"] = 0.4;
        model.PTrue["Because so."] = pTrue;
        model.PTrue["Not: Because so."] = pTrueOfNegation;

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(expected, built.Tree[1].Integrity);
        Assert.Equal(Integrity.IntegralTrue, built.Tree.Root.Integrity);
    }

    [Theory]
    // Hand-computed: w = p(T|E) / (p(T|E) + p(T|~E)).
    [InlineData(0.8, 0.2, 0.8)]
    [InlineData(0.6, 0.3, 0.6666666666666666)]
    [InlineData(0.25, 0.75, 0.25)]
    [InlineData(0.0, 0.0, 0.5)]
    public async Task BuildAsync_Probabilities_GiveBelief(double pTrue, double pTrueOfNegation, double expected)
    {
        var model = new ScriptedModel();
        model.PTrue["Claim"] = pTrue;
        model.PTrue["Not: Claim"] = pTrueOfNegation;

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(expected, built.Tree.Root.Belief, 12);
        Assert.Equal(pTrue, built.Tree.Root.PTrue, 12);
        Assert.Equal(pTrueOfNegation, built.Tree.Root.PTrueOfNegation, 12);
    }

    [Fact]
    public async Task BuildAsync_DuplicateStatements_AreOneNode()
    {
        var model = new ScriptedModel { PTrueWith = s => s.StartsWith("Not: ", StringComparison.Ordinal) ? 0.2 : 0.7 };
        model.Explanations[("Water is wet.", true)] = ["Water makes things wet.", "water  makes things WET", "Water is wet"];
        model.Explanations[("Water is wet.", false)] = ["Water makes things wet!", "Wetness is a feeling."];
        var shape = new TreeShape([new LevelShape(3, Decoding.Sampling())]);

        var built = await new TreeBuilder(model, shape, NegationMode.Model).BuildAsync("Water is wet.", new CallMeter(), CancellationToken.None);

        Assert.Equal(["Water is wet.", "Water makes things wet.", "Wetness is a feeling."], built.Tree.Statements.Select(s => s.Text));
        Assert.Equal([null, true, false], built.Tree.Statements.Select(s => s.GeneratedFor));
    }

    [Fact]
    public async Task BuildAsync_TooManyTextsAndBlankOnes_KeepsWidthAndSkipsBlank()
    {
        var model = new ScriptedModel { PTrueWith = _ => 0.7 };
        model.Explanations[("Claim", true)] = ["  \n", "First one.", "Second one."];

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        Assert.Equal(["Claim"], built.Tree.Statements.Select(s => s.Text));
    }

    [Fact]
    public async Task BuildAsync_NegationEmptyOrEcho_FallsBackToPrefix()
    {
        var model = new ScriptedModel { PTrueWith = _ => 0.7 };
        model.Negations["The sky is green."] = "   ";
        model.Explanations[("The sky is green.", true)] = ["Grass is blue."];
        model.Negations["Grass is blue."] = "grass is blue";

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Model).BuildAsync("The sky is green.", new CallMeter(), CancellationToken.None);

        Assert.Equal("It is not true that the sky is green.", built.Tree.Root.Negation);
        Assert.False(built.Tree.Root.NegationFromModel);
        Assert.Equal("It is not true that Grass is blue.", built.Tree[1].Negation);
    }

    [Fact]
    public async Task BuildAsync_PrefixMode_AsksNoNegations()
    {
        var model = new ScriptedModel { PTrueWith = _ => 0.7 };
        model.Explanations[("Claim", true)] = ["Because."];
        var meter = new CallMeter();

        var built = await new TreeBuilder(model, OneLevel, NegationMode.Prefix).BuildAsync("Claim", meter, CancellationToken.None);

        Assert.DoesNotContain(model.Generations, g => g.Purpose == GenerationPurpose.Negation);
        Assert.All(built.Tree.Statements, s => Assert.False(s.NegationFromModel));
        // 2 abductions + 2 statements x 2 answer requests.
        Assert.Equal(6, meter.Calls);
        Assert.Equal(6, model.Generations.Count + model.Answers.Count);
        Assert.Equal(new TokenUsage(2 * 10 + 4 * 20, 2 * 5 + 4 * 1), meter.Tokens);
    }

    [Fact]
    public async Task BuildAsync_ModelWithLatency_IssuesALevelsRequestsTogether()
    {
        var model = ScriptedModel.Growing(s => s.StartsWith("Not: ", StringComparison.Ordinal) ? 0.2 : 0.7, TimeSpan.FromMilliseconds(40));

        await new TreeBuilder(model, TreeShape.Default, NegationMode.Model).BuildAsync("Claim", new CallMeter(), CancellationToken.None);

        // Depth 1: six integral explanations, so twelve answer requests in one go.
        Assert.True(model.MaxInFlight >= 12, $"at most {model.MaxInFlight} requests were in flight together");
    }

    [Fact]
    public void Prune_NonIntegralLeaves_RemovedRepeatedlyRootStays()
    {
        Statement[] statements =
        [
            Node(0, null, Integrity.NotIntegral),
            Node(1, 0, Integrity.NotIntegral), // loses its only child, then goes too
            Node(2, 1, Integrity.NotIntegral),
            Node(3, 0, Integrity.IntegralTrue),
            Node(4, 0, Integrity.NotIntegral), // keeps an integral child
            Node(5, 4, Integrity.IntegralFalse),
            Node(6, 4, Integrity.NotIntegral),
        ];

        var pruned = TreeBuilder.Prune(statements);

        Assert.Equal([true, false, false, true, true, true, false], pruned.Select(s => s.Kept));
    }

    [Fact]
    public void Prune_RootWithoutIntegralDescendants_RootAloneStays()
    {
        var pruned = TreeBuilder.Prune([Node(0, null, Integrity.NotIntegral), Node(1, 0, Integrity.NotIntegral)]);

        Assert.Equal([true, false], pruned.Select(s => s.Kept));
    }

    [Theory]
    [InlineData(" the sun is hot.\nQ: next", "The sun is hot.")]
    [InlineData("\"quoted\"", "Quoted")]
    [InlineData("   ", "")]
    public void Clean_GeneratedText_FirstLineCapitalised(string generated, string expected) =>
        Assert.Equal(expected, TreeBuilder.Clean(generated));

    private static ScriptedModel ScriptedCopy(ScriptedModel model)
    {
        var copy = new ScriptedModel { PTrueWith = model.PTrueWith };
        foreach (var (key, texts) in model.Explanations)
        {
            copy.Explanations[key] = texts;
        }

        return copy;
    }

    internal static Statement Node(int id, int? parent, Integrity integrity, double belief = 0.5, bool? generatedFor = null, int depth = -1) =>
        new(id, $"S{id}", $"not S{id}", true, depth >= 0 ? depth : parent is null ? 0 : 1, parent,
            parent is null ? null : generatedFor ?? true, 0.5, 0.5, integrity, belief, Kept: true);
}
