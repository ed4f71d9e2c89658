using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.LoopbackEndpoint;
using Plumbline.Models.Http;
using Xunit;

namespace Plumbline.Models.Tests.Http;

/// <summary>The HTTP backend against a real OpenAI-compatible server on 127.0.0.1.</summary>
public sealed class HttpLanguageModelTests
{
    private const string Statement = "Bats are mammals.";

    [Theory]
    [InlineData(HttpApi.Chat)]
    [InlineData(HttpApi.Completions)]
    public async Task ScoreAnswers_WithLogprobs_RenormalisesTheAnswerMass(HttpApi api)
    {
        await using var server = await LoopbackModelServer.StartAsync();
        var opened = await Endpoint.OpenAsync(server, Endpoint.Options(api));
        await using var model = opened.Model;

        var result = await model.ScoreAnswersAsync(new AnswerRequest(Statement, PromptBook.Answer(Statement)), CancellationToken.None);

        // The server lists 0.8p + 0.15p for True and 0.8(1-p) + 0.15(1-p) for False: renormalised, exactly p.
        var p = new ScriptedAnswers().BeliefOf("Bats are mammals");
        Assert.Equal(p, result.True, 9);
        Assert.False(result.Estimated);
        Assert.Empty(opened.Notices);
        Assert.True(result.Usage.PromptTokens > 0);
    }

    [Fact]
    public async Task ScoreAnswers_ServerWithoutLogprobs_VotesAndFlagsEstimated()
    {
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(Logprobs: false));
        var opened = await Endpoint.OpenAsync(server, Endpoint.Options(votes: 10));
        await using var model = opened.Model;

        var result = await model.ScoreAnswersAsync(new AnswerRequest(Statement, PromptBook.Answer(Statement)), CancellationToken.None);

        // The server answers True for the k-th of n samples when (k + 0.5) / n < p: the share is round(p * n) / n.
        var p = new ScriptedAnswers().BeliefOf("Bats are mammals");
        Assert.Equal(Math.Round(p * 10) / 10, result.True, 9);
        Assert.True(result.Estimated);
        Assert.Contains("estimated", Assert.Single(opened.Notices), StringComparison.Ordinal);
    }

    [Fact]
    public async Task Generate_AsksForNTexts_AndSendsTheSeed()
    {
        await using var server = await LoopbackModelServer.StartAsync();
        var opened = await Endpoint.OpenAsync(server, Endpoint.Options(seed: 42));
        await using var model = opened.Model;
        var request = new GenerationRequest(GenerationPurpose.Abduction, Statement, true, PromptBook.Abduction(Statement, true), Decoding.Sampling(), 3);

        var result = await model.GenerateAsync(request, CancellationToken.None);

        var answers = new ScriptedAnswers();
        Assert.Equal([answers.Explanation("Bats are mammals", true, 0), answers.Explanation("Bats are mammals", true, 1), answers.Explanation("Bats are mammals", true, 2)], result.Texts);
        Assert.Contains("\"seed\":\"42\"", opened.Identity.CanonicalJson, StringComparison.Ordinal);
        // The set-up check and the generation both carried the seed.
        Assert.Equal([42, 42], server.Seeds);
    }

    [Fact]
    public async Task Requests_CarryExtraHeadersFromTheirVariables()
    {
        await using var server = await LoopbackModelServer.StartAsync();
        var options = Endpoint.Options() with { Headers = [new HeaderFromVariable("X-Project", "PLUMB_TEST_PROJECT")] };
        var opened = await Endpoint.OpenAsync(server, options, new Dictionary<string, string> { ["PLUMB_TEST_PROJECT"] = "proj-7" });
        await using var model = opened.Model;

        await model.ScoreAnswersAsync(new AnswerRequest(Statement, PromptBook.Answer(Statement)), CancellationToken.None);

        Assert.Equal(["X-Project: proj-7", "X-Project: proj-7"], server.ExtraHeaders);
        Assert.DoesNotContain("proj-7", model.Describe, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Identity_DiffersByModelNameSeedAndApi()
    {
        await using var server = await LoopbackModelServer.StartAsync();
        var a = (await Endpoint.OpenAsync(server, Endpoint.Options())).Identity;
        var b = (await Endpoint.OpenAsync(server, Endpoint.Options() with { ModelName = "other" })).Identity;
        var c = (await Endpoint.OpenAsync(server, Endpoint.Options(seed: 1))).Identity;
        var d = (await Endpoint.OpenAsync(server, Endpoint.Options(HttpApi.Completions))).Identity;

        Assert.Equal(4, new[] { a.Key, b.Key, c.Key, d.Key }.Distinct().Count());
        Assert.Equal(a, (await Endpoint.OpenAsync(server, Endpoint.Options())).Identity);
    }
}
