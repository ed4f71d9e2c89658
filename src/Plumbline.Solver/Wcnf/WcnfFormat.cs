namespace Plumbline.Solver.Wcnf;

/// <summary>Which generation of the weighted DIMACS format a file uses.</summary>
public enum WcnfFormat
{
    /// <summary><c>p wcnf nbvar nbclauses [top]</c> header; with a top, clauses of weight >= top are hard.</summary>
    Pre2022Weighted,

    /// <summary><c>p cnf nbvar nbclauses</c> header; every clause is soft with weight 1.</summary>
    Pre2022Unweighted,

    /// <summary>No header; hard clauses start with <c>h</c>, soft ones with their weight.</summary>
    Since2022,
}
