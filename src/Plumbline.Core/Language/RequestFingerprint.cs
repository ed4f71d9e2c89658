using System.Globalization;
using System.Security.Cryptography;
using System.Text;

namespace Plumbline.Core.Language;

/// <summary>
/// A model-independent, canonical description of one request (<see cref="CanonicalJson"/>) and its
/// SHA-256 key. Recordings and the response cache are keyed on it, so the canonical form must never
/// depend on the machine, culture or runtime: keys are written in a fixed order, strings escape only
/// what JSON requires, and numbers use one invariant spelling. The rendered prompt is deliberately
/// left out; <see cref="PromptVersion"/> stands for it, so that a prompt template change is a version
/// bump rather than a silent change of every key.
/// </summary>
public sealed record RequestFingerprint
{
    public const string GenerateKind = "generate";
    public const string AnswerKind = "answer";

    private RequestFingerprint(string kind, string promptVersion, string canonicalJson)
    {
        Kind = kind;
        PromptVersion = promptVersion;
        CanonicalJson = canonicalJson;
        Key = HashOf(canonicalJson);
    }

    /// <summary><see cref="GenerateKind"/> or <see cref="AnswerKind"/>.</summary>
    public string Kind { get; }

    public string PromptVersion { get; }

    /// <summary>The canonical JSON object whose UTF-8 bytes are hashed.</summary>
    public string CanonicalJson { get; }

    /// <summary>Lower-case hex SHA-256 of <see cref="CanonicalJson"/>.</summary>
    public string Key { get; }

    public static RequestFingerprint Of(GenerationRequest request, string promptVersion)
    {
        ArgumentNullException.ThrowIfNull(request);
        return ForGeneration(request.Purpose, request.Subject, request.Answer, request.Count, request.Decoding, promptVersion, request.SampleIndex);
    }

    public static RequestFingerprint Of(AnswerRequest request, string promptVersion)
    {
        ArgumentNullException.ThrowIfNull(request);
        return ForAnswer(request.Statement, promptVersion);
    }

    /// <summary>The fingerprint of a generation request described without its rendered prompt
    /// (what a recording file holds). The sample index is written only when it is above 0, so the
    /// first sample of a request keeps the key it had before sample indices existed.</summary>
    public static RequestFingerprint ForGeneration(
        GenerationPurpose purpose, string subject, bool? answer, int count, Decoding decoding, string promptVersion, int sampleIndex = 0)
    {
        ArgumentNullException.ThrowIfNull(subject);
        ArgumentOutOfRangeException.ThrowIfNegative(sampleIndex);
        ArgumentNullException.ThrowIfNull(decoding);
        ArgumentNullException.ThrowIfNull(decoding.Stop);
        RequireVersion(promptVersion);

        var json = new StringBuilder(256);
        json.Append('{');
        Field(json, "kind", first: true); Text(json, GenerateKind);
        Field(json, "purpose"); Text(json, NameOf(purpose));
        Field(json, "subject"); Text(json, subject);
        Field(json, "answer"); json.Append(answer switch { true => "true", false => "false", null => "null" });
        Field(json, "n"); json.Append(count.ToString(CultureInfo.InvariantCulture));
        Field(json, "temperature"); Real(json, decoding.Temperature, nameof(decoding.Temperature));
        Field(json, "top_p"); Real(json, decoding.TopP, nameof(decoding.TopP));
        Field(json, "max_tokens"); json.Append(decoding.MaxTokens.ToString(CultureInfo.InvariantCulture));
        Field(json, "stop");
        json.Append('[');
        for (var i = 0; i < decoding.Stop.Count; i++)
        {
            if (i > 0)
            {
                json.Append(',');
            }

            Text(json, decoding.Stop[i] ?? throw new ArgumentException("stop sequences must not be null", nameof(decoding)));
        }

        json.Append(']');
        if (sampleIndex > 0)
        {
            Field(json, "sample"); json.Append(sampleIndex.ToString(CultureInfo.InvariantCulture));
        }

        Field(json, "prompt_version"); Text(json, promptVersion);
        json.Append('}');
        return new RequestFingerprint(GenerateKind, promptVersion, json.ToString());
    }

    public static RequestFingerprint ForAnswer(string statement, string promptVersion)
    {
        ArgumentNullException.ThrowIfNull(statement);
        RequireVersion(promptVersion);

        var json = new StringBuilder(128);
        json.Append('{');
        Field(json, "kind", first: true); Text(json, AnswerKind);
        Field(json, "statement"); Text(json, statement);
        Field(json, "prompt_version"); Text(json, promptVersion);
        json.Append('}');
        return new RequestFingerprint(AnswerKind, promptVersion, json.ToString());
    }

    /// <summary>Lower-case hex SHA-256 of the UTF-8 bytes of <paramref name="canonicalJson"/>.</summary>
    public static string HashOf(string canonicalJson)
    {
        ArgumentNullException.ThrowIfNull(canonicalJson);
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(canonicalJson)));
    }

    /// <summary>The spelling of a purpose in fingerprints; spelled out rather than taken from the enum
    /// member name so that renaming a member cannot change keys.</summary>
    public static string NameOf(GenerationPurpose purpose) => purpose switch
    {
        GenerationPurpose.Abduction => "abduction",
        GenerationPurpose.Negation => "negation",
        _ => throw new ArgumentOutOfRangeException(nameof(purpose), purpose, "unknown generation purpose"),
    };

    public static bool TryParsePurpose(string name, out GenerationPurpose purpose)
    {
        switch (name)
        {
            case "abduction":
                purpose = GenerationPurpose.Abduction;
                return true;
            case "negation":
                purpose = GenerationPurpose.Negation;
                return true;
            default:
                purpose = default;
                return false;
        }
    }

    /// <summary>
    /// The invariant spelling of a real number: the shortest text that reads back to the same double,
    /// with ".0" added to whole numbers so that a real never looks like an integer; -0 is written as 0.
    /// </summary>
    public static string FormatReal(double value)
    {
        if (!double.IsFinite(value))
        {
            throw new ArgumentOutOfRangeException(nameof(value), value, "only finite numbers have a JSON spelling");
        }

        if (value == 0)
        {
            return "0.0";
        }

        var text = value.ToString("R", CultureInfo.InvariantCulture);
        return text.All(c => c == '-' || char.IsAsciiDigit(c)) ? text + ".0" : text;
    }

    private static void RequireVersion(string promptVersion)
    {
        if (string.IsNullOrEmpty(promptVersion))
        {
            throw new ArgumentException("a prompt version is required", nameof(promptVersion));
        }
    }

    private static void Field(StringBuilder json, string name, bool first = false) => CanonicalJsonWriter.Field(json, name, first);

    private static void Real(StringBuilder json, double value, string name)
    {
        if (!double.IsFinite(value))
        {
            throw new ArgumentOutOfRangeException(name, value, "decoding settings must be finite numbers");
        }

        json.Append(FormatReal(value));
    }

    private static void Text(StringBuilder json, string value) => CanonicalJsonWriter.Text(json, value);
}
