using Plumbline.Core.Language;

namespace Plumbline.Models.Tests.Recording;

/// <summary>Requests as the engine would build them; the prompt text is deliberately odd, because
/// fingerprints must not depend on it.</summary>
internal static class Requests
{
    public const string Version = "test-1";

    public static GenerationRequest Abduction(string subject, bool answer, int n = 3, Decoding? decoding = null) =>
        new(GenerationPurpose.Abduction, subject, answer, $"PROMPT {Guid.NewGuid()}", decoding ?? Decoding.Sampling(), n);

    public static GenerationRequest Negation(string subject) =>
        new(GenerationPurpose.Negation, subject, null, $"PROMPT {Guid.NewGuid()}", Decoding.Greedy(), 1);

    public static AnswerRequest Answer(string statement) => new(statement, $"PROMPT {Guid.NewGuid()}");

    /// <summary>A hand-written abduction line without key, with the engine's default sampling settings.</summary>
    public static string AbductionLine(string subject, bool answer, int n, params string[] texts) =>
        "{\"request\":{\"kind\":\"generate\",\"purpose\":\"abduction\",\"subject\":\"" + subject + "\",\"answer\":"
        + (answer ? "true" : "false") + ",\"n\":" + n
        + ",\"temperature\":1.0,\"top_p\":1.0,\"max_tokens\":64,\"stop\":[\"\\n\"],\"prompt_version\":\"" + Version + "\"},"
        + "\"response\":{\"texts\":[" + string.Join(',', texts.Select(t => "\"" + t + "\"")) + "]}}";

    /// <summary>A hand-written answer line without key.</summary>
    public static string AnswerLine(string statement, string pTrue, string pFalse) =>
        "{\"request\":{\"kind\":\"answer\",\"statement\":\"" + statement + "\",\"prompt_version\":\"" + Version + "\"},"
        + "\"response\":{\"p_true\":" + pTrue + ",\"p_false\":" + pFalse + "}}";
}
