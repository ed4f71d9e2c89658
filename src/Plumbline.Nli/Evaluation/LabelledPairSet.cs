namespace Plumbline.Nli.Evaluation;

/// <summary>The labelled pairs of one file, and how many rows were skipped for having no gold label ("-").</summary>
public sealed record LabelledPairSet(string File, IReadOnlyList<LabelledPair> Pairs, int SkippedUnlabelled);
