using Plumbline.Core.Inputs;

namespace Plumbline.Models.Recording;

/// <summary>A recording file line that cannot be used; <see cref="InputFormatException.Field"/> is a dotted path such as "response.p_true".</summary>
public sealed class RecordingFormatException(string file, int line, string? field, string problem)
    : InputFormatException(file, line, field, problem);
