using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>A finished, pruned tree and the model's direct answers for its root.</summary>
/// <param name="Tree">The tree, pruned statements included.</param>
/// <param name="DirectAnswer">p(True | claim) above 0.5.</param>
/// <param name="PairedDirectAnswer">p(True | claim) against p(True | negated claim); a tie gives <paramref name="DirectAnswer"/>.</param>
/// <param name="CutOffDiscarded">Explanations dropped because they did not end a sentence.</param>
internal sealed record BuiltTree(ExplanationTree Tree, bool DirectAnswer, bool PairedDirectAnswer, int CutOffDiscarded);
