using Plumbline.Core.Inputs;

namespace Plumbline.Solver.Wcnf;

/// <summary>A WCNF file that cannot be read; the field names the part of the format, e.g. <c>clause weight</c>, <c>literal</c>, <c>header top</c>.</summary>
public sealed class WcnfFormatException(string file, int line, string field, string problem)
    : InputFormatException(file, line, field, problem);
