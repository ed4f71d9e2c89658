using Plumbline.Core.Inputs;

namespace Plumbline.Cli.Input;

/// <summary>A claim file line that cannot be used ("claim", "gold", "id" ...); line 0 when the file as a whole is wrong.</summary>
public sealed class ClaimFileException(string file, int line, string? field, string problem)
    : InputFormatException(file, line, field, problem);
