using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>A finished, pruned tree and the model's direct answer for its root.</summary>
internal sealed record BuiltTree(ExplanationTree Tree, bool DirectAnswer);
