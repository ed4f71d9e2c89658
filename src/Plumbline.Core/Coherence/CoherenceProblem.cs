using Plumbline.Core.MaxSat;

namespace Plumbline.Core.Coherence;

/// <summary>The MAX-SAT problem of one claim, with enough context to read its solution and export it.</summary>
/// <param name="Problem">Clauses with integer weights (real weight × <see cref="Scale"/>, rounded).</param>
/// <param name="Origins">For each clause, in order, why it exists.</param>
/// <param name="StatementOfVariable">Statement id of variable v at index v - 1.</param>
/// <param name="Scale">The weight scale used.</param>
public sealed record CoherenceProblem(
    MaxSatProblem Problem,
    IReadOnlyList<ClauseOrigin> Origins,
    IReadOnlyList<int> StatementOfVariable,
    int Scale)
{
    /// <summary>The DIMACS variable (from 1) of a statement.</summary>
    public int VariableOf(int statementId)
    {
        for (var i = 0; i < StatementOfVariable.Count; i++)
        {
            if (StatementOfVariable[i] == statementId)
            {
                return i + 1;
            }
        }

        throw new ArgumentOutOfRangeException(nameof(statementId), $"statement #{statementId} has no variable");
    }
}
