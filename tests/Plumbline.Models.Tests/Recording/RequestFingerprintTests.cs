using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using Plumbline.Core.Language;
using Xunit;

namespace Plumbline.Models.Tests.Recording;

public sealed class RequestFingerprintTests
{
    private static readonly Decoding Base = new(1.0, 1.0, 64, ["\n"]);

    private static GenerationRequest Generation(
        GenerationPurpose purpose = GenerationPurpose.Abduction,
        string subject = "Bats are mammals.",
        bool? answer = true,
        int n = 3,
        Decoding? decoding = null,
        string prompt = "prompt A",
        int sample = 0) =>
        new(purpose, subject, answer, prompt, decoding ?? Base, n, sample);

    [Fact]
    public void Of_SameRequestWithOtherPromptText_SameKey()
    {
        var a = RequestFingerprint.Of(Generation(prompt: "prompt A"), "v1");
        var b = RequestFingerprint.Of(Generation(prompt: "a different rendering", decoding: new Decoding(1.0, 1.0, 64, ["\n"])), "v1");

        Assert.Equal(a.Key, b.Key);
        Assert.Equal(a.CanonicalJson, b.CanonicalJson);
        Assert.Equal(64, a.Key.Length);
    }

    public static TheoryData<string, GenerationRequest, string> Variants() => new()
    {
        { "purpose", Generation(purpose: GenerationPurpose.Negation), "v1" },
        { "subject", Generation(subject: "Bats are mammals"), "v1" },
        { "subject case", Generation(subject: "bats are mammals."), "v1" },
        { "answer false", Generation(answer: false), "v1" },
        { "answer null", Generation(answer: null), "v1" },
        { "n", Generation(n: 4), "v1" },
        { "temperature", Generation(decoding: Base with { Temperature = 0.7 }), "v1" },
        { "top_p", Generation(decoding: Base with { TopP = 0.95 }), "v1" },
        { "max_tokens", Generation(decoding: Base with { MaxTokens = 65 }), "v1" },
        { "stop text", Generation(decoding: Base with { Stop = ["."] }), "v1" },
        { "stop extra", Generation(decoding: Base with { Stop = ["\n", "."] }), "v1" },
        { "stop empty", Generation(decoding: Base with { Stop = [] }), "v1" },
        { "prompt version", Generation(), "v2" },
        { "sample 1", Generation(sample: 1), "v1" },
        { "sample 2", Generation(sample: 2), "v1" },
    };

    [Theory]
    [MemberData(nameof(Variants))]
    public void Of_OneFieldChanged_DifferentKey(string change, GenerationRequest changed, string version)
    {
        var baseKey = RequestFingerprint.Of(Generation(), "v1").Key;

        Assert.True(baseKey != RequestFingerprint.Of(changed, version).Key, $"changing {change} kept the key");
    }

    [Fact]
    public void Of_AllVariants_PairwiseDistinctKeys()
    {
        var keys = Variants().Select(row => RequestFingerprint.Of((GenerationRequest)row[1], (string)row[2]).Key).ToList();

        Assert.Equal(keys.Count, keys.Distinct().Count());
    }

    [Fact]
    public void Of_StopOrderSwapped_DifferentKey()
    {
        var a = RequestFingerprint.Of(Generation(decoding: Base with { Stop = ["\n", "."] }), "v1");
        var b = RequestFingerprint.Of(Generation(decoding: Base with { Stop = [".", "\n"] }), "v1");

        Assert.NotEqual(a.Key, b.Key);
    }

    [Fact]
    public void Of_AnswerAndGenerationOfSameText_DifferentKeys()
    {
        var answer = RequestFingerprint.Of(new AnswerRequest("Bats are mammals.", "p"), "v1");

        Assert.NotEqual(RequestFingerprint.Of(Generation(), "v1").Key, answer.Key);
        Assert.Equal(RequestFingerprint.AnswerKind, answer.Kind);
    }

    // The expected hex strings below were computed outside .NET with coreutils `sha256sum` over the
    // same canonical text (printf '%s' '<json>' | sha256sum).
    [Fact]
    public void Of_Abduction_MatchesHandWrittenCanonicalJsonAndGoldenKey()
    {
        const string canonical =
            """{"kind":"generate","purpose":"abduction","subject":"Bats are mammals.","answer":true,"n":3,"temperature":1.0,"top_p":1.0,"max_tokens":64,"stop":["\n"],"prompt_version":"test-1"}""";

        var fingerprint = RequestFingerprint.Of(Generation(), "test-1");

        Assert.Equal(canonical, fingerprint.CanonicalJson);
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(canonical))), fingerprint.Key);
        Assert.Equal("d3f40fa4e042146f610b20cb113643d6ed6adfb9a6ffa445b1b3fbdd7aebe564", fingerprint.Key);
    }

    // The first sample leaves the field out (the golden key above is the one every recording made
    // before sample indices existed uses); a later sample adds "sample" just before "prompt_version".
    [Fact]
    public void Of_LaterSample_MatchesHandWrittenCanonicalJsonAndGoldenKey()
    {
        const string canonical =
            """{"kind":"generate","purpose":"abduction","subject":"Bats are mammals.","answer":true,"n":3,"temperature":1.0,"top_p":1.0,"max_tokens":64,"stop":["\n"],"sample":2,"prompt_version":"test-1"}""";

        var fingerprint = RequestFingerprint.Of(Generation(sample: 2), "test-1");

        Assert.Equal(canonical, fingerprint.CanonicalJson);
        Assert.Equal("edd2de6c12db68c2e3bcd8fbcf17a072f859708d0b8218eda10e5e38fe7156e4", fingerprint.Key);
    }

    [Fact]
    public void Of_NegativeSample_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => RequestFingerprint.Of(Generation(sample: -1), "v1"));
    }

    [Fact]
    public void Of_GreedyNegation_MatchesHandWrittenCanonicalJsonAndGoldenKey()
    {
        const string canonical =
            """{"kind":"generate","purpose":"negation","subject":"Bats are mammals.","answer":null,"n":1,"temperature":0.0,"top_p":0.95,"max_tokens":32,"stop":[],"prompt_version":"test-1"}""";

        var fingerprint = RequestFingerprint.Of(
            Generation(purpose: GenerationPurpose.Negation, answer: null, n: 1, decoding: new Decoding(0.0, 0.95, 32, [])), "test-1");

        Assert.Equal(canonical, fingerprint.CanonicalJson);
        Assert.Equal("a69e0e4f8d42596e204425687152fbc2ef4753ed9201ff0bbfa6503169e05b6b", fingerprint.Key);
    }

    [Fact]
    public void Of_AnswerWithQuotesAndNonAscii_EscapesOnlyWhatJsonRequires()
    {
        const string canonical = """{"kind":"answer","statement":"Ein \"Wal\" ist kein Fisch – oder?","prompt_version":"test-1"}""";

        var fingerprint = RequestFingerprint.Of(new AnswerRequest("Ein \"Wal\" ist kein Fisch – oder?", "prompt"), "test-1");

        Assert.Equal(canonical, fingerprint.CanonicalJson);
        Assert.Equal("2a34dbddd64b3c77222b4767ea58eed65331df6eee1b4b76db7d56f066fd80c2", fingerprint.Key);
    }

    [Fact]
    public void Of_ControlCharactersAndBackslash_CanonicalJsonParsesBackToSameText()
    {
        const string subject = "tab\there, \\ back\u0001slash\r\n";

        var fingerprint = RequestFingerprint.Of(Generation(subject: subject), "v1");

        Assert.Contains("\"tab\\there, \\\\ back\\u0001slash\\r\\n\"", fingerprint.CanonicalJson, StringComparison.Ordinal);
        using var parsed = JsonDocument.Parse(fingerprint.CanonicalJson);
        Assert.Equal(subject, parsed.RootElement.GetProperty("subject").GetString());
    }

    [Theory]
    [InlineData(1.0, "1.0")]
    [InlineData(2.0, "2.0")]
    [InlineData(-3.0, "-3.0")]
    [InlineData(0.95, "0.95")]
    [InlineData(-0.0, "0.0")]
    [InlineData(0.1 + 0.2, "0.30000000000000004")] // shortest round-trip spelling (common practice)
    [InlineData(1e-7, "1E-07")]
    [InlineData(1e21, "1E+21")]
    public void FormatReal_Value_InvariantSpelling(double value, string expected)
    {
        Assert.Equal(expected, RequestFingerprint.FormatReal(value));
        Assert.Equal(value, double.Parse(expected, System.Globalization.CultureInfo.InvariantCulture));
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Of_NonFiniteTemperature_Throws(double temperature)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() =>
            RequestFingerprint.Of(Generation(decoding: Base with { Temperature = temperature }), "v1"));
    }

    [Fact]
    public void Of_EmptyPromptVersion_Throws()
    {
        Assert.Throws<ArgumentException>(() => RequestFingerprint.Of(Generation(), ""));
    }

    [Theory]
    [InlineData(GenerationPurpose.Abduction)]
    [InlineData(GenerationPurpose.Negation)]
    public void TryParsePurpose_NameOf_RoundTrips(GenerationPurpose purpose)
    {
        Assert.True(RequestFingerprint.TryParsePurpose(RequestFingerprint.NameOf(purpose), out var parsed));
        Assert.Equal(purpose, parsed);
    }
}
