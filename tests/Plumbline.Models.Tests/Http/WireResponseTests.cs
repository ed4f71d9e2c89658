using System.Text;
using Plumbline.Models.Http;
using Xunit;

namespace Plumbline.Models.Tests.Http;

/// <summary>
/// Answer probabilities read from hand-written response bodies in the two shapes OpenAI-compatible
/// servers use. Expected values are worked out by hand from the log-probabilities in each payload.
/// </summary>
public sealed class WireResponseTests
{
    private static WireResponse Parse(string json, HttpApi api) => WireResponse.Parse(Encoding.UTF8.GetBytes(json), api);

    [Fact]
    public void Parse_ChatShapeWithSpaceAndCaseVariants_AddsUpEachAnswer()
    {
        // ln 0.6, ln 0.1 (True variants), ln 0.2, ln 0.05 (False variants), ln 0.05 (neither).
        const string json = """
            {"choices":[{"index":0,"message":{"role":"assistant","content":" True"},
              "logprobs":{"content":[{"token":" True","logprob":-0.5108256237659907,
                "top_logprobs":[{"token":" True","logprob":-0.5108256237659907},{"token":"true","logprob":-2.302585092994046},
                                {"token":" False","logprob":-1.6094379124341003},{"token":"FALSE","logprob":-2.995732273553991},
                                {"token":" Maybe","logprob":-2.995732273553991}]}]}}],
             "usage":{"prompt_tokens":31,"completion_tokens":1}}
            """;

        var response = Parse(json, HttpApi.Chat);
        var mass = AnswerTokenMass.Of(response.FirstTokenAlternatives!)!.Value;

        Assert.Equal(0.7, mass.True, 9);
        Assert.Equal(0.25, mass.False, 9);
        Assert.Equal(new Plumbline.Core.Language.TokenUsage(31, 1), response.Usage);
        Assert.Equal([" True"], response.Texts);
    }

    [Fact]
    public void Parse_CompletionsShape_ReadsTheTokenToLogprobObject()
    {
        // e^-0.1 = 0.904837..., e^-2.5 = 0.082085...; "▁true" is a SentencePiece spelling of true.
        const string json = """
            {"choices":[{"index":0,"text":"False","logprobs":{"tokens":["False"],"token_logprobs":[-0.1],
              "top_logprobs":[{"False":-0.1,"\u2581true":-2.5,"Fal":-4.0}]}}]}
            """;

        var mass = AnswerTokenMass.Of(Parse(json, HttpApi.Completions).FirstTokenAlternatives!)!.Value;

        Assert.Equal(Math.Exp(-2.5), mass.True, 12);
        Assert.Equal(Math.Exp(-0.1), mass.False, 12);
    }

    [Fact]
    public void Parse_CompletionsWithChatShapedLogprobs_IsReadToo()
    {
        const string json = """
            {"choices":[{"text":" False","logprobs":{"content":[{"token":" False","logprob":-0.2231435513142097,
              "top_logprobs":[{"token":" False","logprob":-0.2231435513142097},{"token":" True","logprob":-1.6094379124341003}]}]}}]}
            """;

        var mass = AnswerTokenMass.Of(Parse(json, HttpApi.Completions).FirstTokenAlternatives!)!.Value;

        Assert.Equal(0.2, mass.True, 9);
        Assert.Equal(0.8, mass.False, 9);
    }

    [Fact]
    public void Of_OneAnswerMissingFromTheTopList_CountsItAsZero()
    {
        const string json = """
            {"choices":[{"message":{"content":"True"},"logprobs":{"content":[{"token":"True","logprob":-0.05,
              "top_logprobs":[{"token":"True","logprob":-0.05},{"token":"Yes","logprob":-3.2}]}]}}]}
            """;

        var mass = AnswerTokenMass.Of(Parse(json, HttpApi.Chat).FirstTokenAlternatives!)!.Value;

        Assert.Equal(Math.Exp(-0.05), mass.True, 12);
        Assert.Equal(0.0, mass.False);
    }

    [Fact]
    public void Of_NeitherAnswerInTheTopList_IsNull()
    {
        const string json = """
            {"choices":[{"message":{"content":"The"},"logprobs":{"content":[{"token":"The","logprob":-0.3,
              "top_logprobs":[{"token":"The","logprob":-0.3},{"token":"It","logprob":-1.5}]}]}}]}
            """;

        Assert.Null(AnswerTokenMass.Of(Parse(json, HttpApi.Chat).FirstTokenAlternatives!));
    }

    [Fact]
    public void Parse_NoLogprobs_HasNoAlternatives()
    {
        var response = Parse("""{"choices":[{"index":0,"message":{"content":"True"}}]}""", HttpApi.Chat);

        Assert.Null(response.FirstTokenAlternatives);
        Assert.Equal(Plumbline.Core.Language.TokenUsage.None, response.Usage);
    }

    [Fact]
    public void Parse_ChoicesOutOfOrder_AreSortedByIndex()
    {
        var response = Parse("""{"choices":[{"index":1,"text":"b"},{"index":0,"text":"a"}]}""", HttpApi.Completions);

        Assert.Equal(["a", "b"], response.Texts);
    }

    [Theory]
    [InlineData("{\"choices\": [ {\"text\": \"tru")]
    [InlineData("{\"object\":\"error\"}")]
    [InlineData("{\"choices\":[{\"message\":{\"role\":\"assistant\"}}]}")]
    public void Parse_GarbledBody_IsATransientFailure(string body)
    {
        var failure = Assert.Throws<EndpointFailure>(() => Parse(body, HttpApi.Chat));

        Assert.True(failure.Transient);
    }

    [Theory]
    [InlineData(" True", true)]
    [InlineData("TRUE", true)]
    [InlineData("\u0120true", true)]
    [InlineData("False.", false)]
    [InlineData(" false", false)]
    [InlineData("Tr", null)]
    [InlineData("Truth", null)]
    public void AnswerOf_Spellings(string token, bool? expected) => Assert.Equal(expected, AnswerTokenMass.AnswerOf(token));
}
