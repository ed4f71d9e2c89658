namespace Plumbline.Core.Entailment;

public readonly record struct SentencePair(string Premise, string Hypothesis);
