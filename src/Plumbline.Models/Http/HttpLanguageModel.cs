using Plumbline.Core.Language;

namespace Plumbline.Models.Http;

/// <summary>
/// A model behind an OpenAI-compatible endpoint. Texts come from chat or plain completions; answer
/// probabilities from the log-probabilities of the first answer token (True and False spellings added
/// up, renormalised over the two), or, when the endpoint gives none, from the share of sampled answers,
/// flagged as estimated.
/// </summary>
public sealed class HttpLanguageModel : ILanguageModel
{
    // A one-token answer; two leave room for a leading space or quote before the word when sampling votes.
    private const int AnswerTokens = 1;
    private const int VoteTokens = 2;

    private readonly EndpointClient client;
    private readonly HttpModelOptions options;

    internal HttpLanguageModel(EndpointClient client, HttpModelOptions options, BeliefMethod beliefs)
    {
        this.client = client;
        this.options = options;
        Beliefs = beliefs;
    }

    public string Describe => $"{options.ModelName} at {client.Shown}";

    public BeliefMethod Beliefs { get; }

    public async Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        var decoding = request.Decoding;
        var texts = new List<string>(request.Count);
        var usage = TokenUsage.None;
        // Some servers ignore n and return one choice; ask again for the rest, each round with its own seed
        // so that a seeded endpoint does not repeat itself.
        for (var round = 0; texts.Count < request.Count && round < request.Count; round++)
        {
            var wanted = request.Count - texts.Count;
            var body = WireRequest.Body(options.Api, options.ModelName, request.Prompt, isAnswer: false,
                decoding.Temperature, decoding.TopP, decoding.MaxTokens, decoding.Stop, wanted, SeedFor(round), topAlternatives: 0);
            var response = await client.SendAsync(body, Estimate(request.Prompt, decoding.MaxTokens * wanted), requireAlternatives: false, cancellationToken).ConfigureAwait(false);
            texts.AddRange(response.Texts.Take(wanted));
            usage += response.Usage;
        }

        if (texts.Count < request.Count)
        {
            throw new ModelRequestException($"{Describe} returned {texts.Count} texts where {request.Count} were asked for");
        }

        return new GenerationResult(texts, usage);
    }

    public async Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (Beliefs == BeliefMethod.Votes)
        {
            return await VoteAsync(request.Prompt, TokenUsage.None, cancellationToken).ConfigureAwait(false);
        }

        var body = WireRequest.Body(options.Api, options.ModelName, request.Prompt, isAnswer: true,
            0.0, 1.0, AnswerTokens, [], 1, options.Seed, options.TopAlternatives);
        var response = await client.SendAsync(body, Estimate(request.Prompt, AnswerTokens), requireAlternatives: true, cancellationToken).ConfigureAwait(false);
        if (AnswerTokenMass.Of(response.FirstTokenAlternatives!) is { } mass)
        {
            return AnswerProbabilities.FromRaw(mass.True, mass.False, estimated: false, response.Usage);
        }

        // Neither answer among the top alternatives: the model would start its reply some other way, so
        // only sampling whole answers can say what it believes.
        return await VoteAsync(request.Prompt, response.Usage, cancellationToken).ConfigureAwait(false);
    }

    public ValueTask DisposeAsync()
    {
        client.Dispose();
        return ValueTask.CompletedTask;
    }

    private async Task<AnswerProbabilities> VoteAsync(string prompt, TokenUsage spent, CancellationToken cancellationToken)
    {
        int votes = 0, forTrue = 0, forFalse = 0;
        var usage = spent;
        for (var round = 0; votes < options.Votes && round < options.Votes; round++)
        {
            var wanted = options.Votes - votes;
            var body = WireRequest.Body(options.Api, options.ModelName, prompt, isAnswer: true,
                1.0, 1.0, VoteTokens, [], wanted, SeedFor(round), topAlternatives: 0);
            var response = await client.SendAsync(body, Estimate(prompt, VoteTokens * wanted), requireAlternatives: false, cancellationToken).ConfigureAwait(false);
            foreach (var text in response.Texts.Take(wanted))
            {
                votes++;
                switch (AnswerTokenMass.AnswerOf(FirstWord(text)))
                {
                    case true: forTrue++; break;
                    case false: forFalse++; break;
                }
            }

            usage += response.Usage;
        }

        return AnswerProbabilities.FromRaw(forTrue, forFalse, estimated: true, usage);
    }

    private static string FirstWord(string text)
    {
        var trimmed = text.TrimStart();
        var end = trimmed.IndexOfAny([' ', '\n', '\r', '\t']);
        return end < 0 ? trimmed : trimmed[..end];
    }

    private int? SeedFor(int round) => options.Seed is { } seed ? unchecked(seed + round) : null;

    /// <summary>Tokens a request may use, for the tokens-per-minute limit: about four characters a token
    /// for the prompt (common practice for English text) plus everything it may write.</summary>
    private static int Estimate(string prompt, int completionTokens) => prompt.Length / 4 + completionTokens;
}
