using Plumbline.Core.Inputs;

namespace Plumbline.Application.Input;

/// <summary>A claim input line (or record) that cannot be used ("claim", "gold", "id" ...); line 0 when the input as a whole is wrong.</summary>
public sealed class ClaimFileException(string file, int line, string? field, string problem)
    : InputFormatException(file, line, field, problem);
