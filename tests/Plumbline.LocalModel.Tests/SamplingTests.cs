using Plumbline.Core.Language;

namespace Plumbline.LocalModel.Tests;

/// <summary>Sampling on the tiny model: seeds, several samples per request, nucleus and temperature.</summary>
public sealed class SamplingTests
{
    private static readonly AnswerCase Answer = TinyModel.Reference.Answers[0];

    private static GenerationRequest Sampled(string prompt, int count, double topP = 1.0, double temperature = 1.0, int maxTokens = 16) =>
        new(GenerationPurpose.Abduction, "subject", true, prompt, new Decoding(temperature, topP, maxTokens, []), count);

    [Fact]
    public async Task Generate_SameSeed_GivesTheSameSamples()
    {
        var request = Sampled(TinyModel.Reference.Greedy[0].Prompt, count: 3);
        using var first = TinyModel.Open(new LocalModelOptions(Seed: 11));
        using var second = TinyModel.Open(new LocalModelOptions(Seed: 11));
        using var other = TinyModel.Open(new LocalModelOptions(Seed: 12));

        var a = await first.GenerateAsync(request, CancellationToken.None);
        var b = await second.GenerateAsync(request, CancellationToken.None);
        var c = await other.GenerateAsync(request, CancellationToken.None);

        Assert.Equal(a.Texts, b.Texts);
        Assert.NotEqual(a.Texts, c.Texts);
    }

    [Fact]
    public async Task Generate_SameSeed_DoesNotDependOnRequestOrder()
    {
        var one = Sampled(TinyModel.Reference.Greedy[0].Prompt, count: 2);
        var two = Sampled(TinyModel.Reference.Greedy[1].Prompt, count: 2);
        using var first = TinyModel.Open(new LocalModelOptions(Seed: 5));
        using var second = TinyModel.Open(new LocalModelOptions(Seed: 5));

        var oneFirst = await first.GenerateAsync(one, CancellationToken.None);
        _ = await first.GenerateAsync(two, CancellationToken.None);
        _ = await second.GenerateAsync(two, CancellationToken.None);
        var oneSecond = await second.GenerateAsync(one, CancellationToken.None);

        Assert.Equal(oneFirst.Texts, oneSecond.Texts);
    }

    [Fact]
    public void Generate_SeveralSamples_AreDrawnApartAndCounted()
    {
        using var model = TinyModel.Open(new LocalModelOptions(Seed: 3));
        var reference = TinyModel.Reference.Greedy[0];

        var generated = model.Generate(Sampled(reference.Prompt, count: 4), CancellationToken.None);

        Assert.Equal(4, generated.Result.Texts.Count);
        Assert.True(generated.Result.Texts.Distinct().Count() > 1, "four samples from a random model came out identical");
        Assert.Equal(generated.Ids.Sum(ids => ids.Length), generated.Result.Usage.CompletionTokens);
        Assert.Equal(reference.PromptIds.Length, generated.Result.Usage.PromptTokens);
    }

    [Fact]
    public void Generate_GreedyWithCountThree_RepeatsTheOneContinuation()
    {
        using var model = TinyModel.Open();
        var reference = TinyModel.Reference.Greedy[1];

        var generated = model.Generate(ReferenceTests.Greedy(reference.Prompt, reference.MaxTokens, [], count: 3), CancellationToken.None);

        Assert.All(generated.Result.Texts, text => Assert.Equal(reference.Text, text));
        Assert.Equal(reference.Ids.Length, generated.Result.Usage.CompletionTokens);
    }

    [Fact]
    public void Generate_TopPBelowTheLikeliestToken_AlwaysDrawsIt()
    {
        // Nucleus sampling keeps the smallest set of tokens whose mass reaches p (Holtzman et al., "The Curious
        // Case of Neural Text Degeneration", ICLR 2020); below the top token's probability that set is the token.
        var top = Array.IndexOf(Answer.NextTokenProbabilities, Answer.NextTokenProbabilities.Max());
        using var model = TinyModel.Open(new LocalModelOptions(Seed: 1));

        var generated = model.Generate(Sampled(Answer.Prompt, count: 20, topP: Answer.NextTokenProbabilities[top] / 2, maxTokens: 1), CancellationToken.None);

        Assert.All(generated.Ids, ids => Assert.Equal([top], ids));
    }

    [Fact]
    public void Generate_TopPHalf_DrawsOnlyFromTheNucleus()
    {
        // The nucleus for p = 0.5: the likeliest tokens of the recipe's softmax until their mass reaches 0.5.
        var ranked = Answer.NextTokenProbabilities.Select((p, token) => (p, token)).OrderByDescending(x => x.p).ToArray();
        var nucleus = new HashSet<int>();
        var mass = 0.0;
        foreach (var (p, token) in ranked)
        {
            nucleus.Add(token);
            mass += p;
            if (mass >= 0.5)
            {
                break;
            }
        }

        using var model = TinyModel.Open(new LocalModelOptions(Seed: 4));

        var generated = model.Generate(Sampled(Answer.Prompt, count: 500, topP: 0.5, maxTokens: 1), CancellationToken.None);

        var drawn = generated.Ids.Where(ids => ids.Length == 1).Select(ids => ids[0]).ToHashSet();
        Assert.Subset(nucleus, drawn);
        Assert.True(drawn.Count > 1, "nucleus sampling drew a single token");
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(0.5)]
    public void Generate_FirstTokenFrequency_MatchesTheTemperedSoftmax(double temperature)
    {
        // Sampling at temperature T draws token i with probability p_i^(1/T) / sum_j p_j^(1/T) (softmax of
        // logits / T), p being the recipe's next-token softmax. 2000 draws: five standard errors of tolerance.
        const int draws = 2000;
        var p = Answer.NextTokenProbabilities;
        var top = Array.IndexOf(p, p.Max());
        var tempered = p.Select(x => Math.Pow(x, 1 / temperature)).ToArray();
        var expected = tempered[top] / tempered.Sum();
        using var model = TinyModel.Open(new LocalModelOptions(Seed: 2));

        var generated = model.Generate(Sampled(Answer.Prompt, count: draws, temperature: temperature, maxTokens: 1), CancellationToken.None);

        var frequency = generated.Ids.Count(ids => ids.Length == 1 && ids[0] == top) / (double)draws;
        var tolerance = 5 * Math.Sqrt(expected * (1 - expected) / draws);
        Assert.True(Math.Abs(frequency - expected) <= tolerance, $"frequency {frequency:F4}, expected {expected:F4} +- {tolerance:F4}");
    }
}
