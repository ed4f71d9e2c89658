using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>One usable line of a recording: exactly one of <see cref="Generation"/> and
/// <see cref="Answer"/> is set, matching <see cref="RequestFingerprint.Kind"/>, and the request the
/// engine would make for it (prompt rendered by this build's templates) beside it.</summary>
internal sealed record RecordedEntry(
    RequestFingerprint Fingerprint,
    int Line,
    string Topic,
    GenerationResult? Generation,
    AnswerProbabilities? Answer,
    string ResponseJson,
    GenerationRequest? GenerationAsked,
    AnswerRequest? AnswerAsked);
