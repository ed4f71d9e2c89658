using System.Text.Json.Serialization;

namespace Plumbline.Core.Trees;

/// <summary>All statements produced for one claim, pruned ones included, in id order (root first).</summary>
public sealed record ExplanationTree(IReadOnlyList<Statement> Statements)
{
    [JsonIgnore]
    public Statement Root => Statements[0];

    /// <summary>The statements that survived pruning (the root always does).</summary>
    [JsonIgnore]
    public IReadOnlyList<Statement> Kept => [.. Statements.Where(s => s.Kept)];

    public Statement this[int id] => Statements[id];

    public IEnumerable<Statement> ChildrenOf(int id) => Statements.Where(s => s.ParentId == id);
}
