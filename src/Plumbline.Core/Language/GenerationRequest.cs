namespace Plumbline.Core.Language;

/// <summary>
/// One text-generation request. <see cref="Subject"/> and <see cref="Answer"/> say what is asked in
/// model-independent terms (recordings are keyed on them); <see cref="Prompt"/> is the rendered text
/// that live backends send. <see cref="SampleIndex"/> tells apart repeated draws of the same request
/// (independently sampled trees of one claim): the same request with another index is another call,
/// cached and recorded apart.
/// </summary>
/// <param name="SampleIndex">
/// Which independent draw of the same sampled request this is (0 for the first). Two trees of one claim
/// grown for a stability check differ only here, so that a cache or recording keyed on the request
/// returns a fresh sample for each tree instead of replaying the first one. Greedy requests always use 0.
/// </param>
public sealed record GenerationRequest(
    GenerationPurpose Purpose,
    string Subject,
    bool? Answer,
    string Prompt,
    Decoding Decoding,
    int Count,
    int SampleIndex = 0);
