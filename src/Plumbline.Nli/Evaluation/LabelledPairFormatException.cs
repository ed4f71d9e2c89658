using Plumbline.Core.Inputs;

namespace Plumbline.Nli.Evaluation;

/// <summary>A labelled-pair file with a bad row; the line is where the row starts.</summary>
public sealed class LabelledPairFormatException(string file, int line, string field, string problem, Exception? inner = null)
    : InputFormatException(file, line, field, problem, inner);
