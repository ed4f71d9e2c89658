namespace Plumbline.Core.Language;

/// <summary>
/// One text-generation request. <see cref="Subject"/> and <see cref="Answer"/> say what is asked in
/// model-independent terms (recordings are keyed on them); <see cref="Prompt"/> is the rendered text
/// that live backends send.
/// </summary>
public sealed record GenerationRequest(
    GenerationPurpose Purpose,
    string Subject,
    bool? Answer,
    string Prompt,
    Decoding Decoding,
    int Count);
