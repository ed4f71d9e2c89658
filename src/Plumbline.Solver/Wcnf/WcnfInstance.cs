using Plumbline.Core.MaxSat;

namespace Plumbline.Solver.Wcnf;

/// <summary>A parsed WCNF file.</summary>
/// <param name="Source">The file name used in messages.</param>
/// <param name="Problem">The clauses, in file order; clause indices in a solution refer to this order.</param>
/// <param name="Format">The format generation detected from the presence and kind of a <c>p</c> line.</param>
/// <param name="Top">The header's top weight, when the header has one.</param>
/// <param name="Comments">Text of the comment lines, without the leading <c>c</c> and one following space.</param>
public sealed record WcnfInstance(
    string Source,
    MaxSatProblem Problem,
    WcnfFormat Format,
    long? Top,
    IReadOnlyList<string> Comments)
{
    public int HardClauseCount => Problem.Clauses.Count(clause => clause.IsHard);

    public int SoftClauseCount => Problem.Clauses.Count - HardClauseCount;
}
