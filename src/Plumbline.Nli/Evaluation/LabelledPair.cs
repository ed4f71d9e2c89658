using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Evaluation;

/// <summary>A sentence pair with its gold label and the line it starts on in its file.</summary>
public sealed record LabelledPair(SentencePair Pair, EntailmentKind Gold, int Line);
