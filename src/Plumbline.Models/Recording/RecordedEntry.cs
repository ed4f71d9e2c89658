using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>One usable line of a recording: exactly one of <see cref="Generation"/> and
/// <see cref="Answer"/> is set, matching <see cref="RequestFingerprint.Kind"/>.</summary>
internal sealed record RecordedEntry(
    RequestFingerprint Fingerprint,
    int Line,
    string Topic,
    GenerationResult? Generation,
    AnswerProbabilities? Answer,
    string ResponseJson);
