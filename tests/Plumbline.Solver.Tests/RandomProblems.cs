using Plumbline.Core.MaxSat;

namespace Plumbline.Solver.Tests;

/// <summary>Seeded random clause sets and an exhaustive reference optimiser for them.</summary>
internal static class RandomProblems
{
    public const int MaxVariables = 12;

    public static MaxSatProblem Create(int seed)
    {
        var random = new Random(seed);
        var variables = random.Next(1, MaxVariables + 1);
        var clauseCount = random.Next(0, 4 * variables + 3);
        var hardShare = random.NextDouble() * 0.6;
        var maxWeight = random.Next(4) switch
        {
            0 => 1L,
            1 => 10L,
            2 => 1000L,
            _ => 1L << 40,
        };

        var clauses = new WeightedClause[clauseCount];
        for (var i = 0; i < clauseCount; i++)
        {
            // Lengths 0..4, so empty, unit, duplicate-literal and tautological clauses all occur.
            var literals = new int[random.Next(0, 5)];
            for (var j = 0; j < literals.Length; j++)
            {
                var variable = random.Next(1, variables + 1);
                literals[j] = random.Next(2) == 0 ? variable : -variable;
            }

            clauses[i] = random.NextDouble() < hardShare
                ? new WeightedClause(literals, 0, IsHard: true)
                : new WeightedClause(literals, random.NextInt64(0, maxWeight + 1));
        }

        return new MaxSatProblem(variables, clauses);
    }

    /// <summary>
    /// Random weighted MAX-3-SAT with ten clauses per variable: far past the satisfiability threshold, so proving the
    /// optimum takes CP-SAT minutes (measured: still unproven after about 19 s of CPU time with 2 workers). Good for
    /// interrupting a search that is surely still running.
    /// </summary>
    public static MaxSatProblem HardMaxThreeSat(int seed)
    {
        const int variables = 80;
        var random = new Random(seed);
        var clauses = new WeightedClause[10 * variables];
        for (var i = 0; i < clauses.Length; i++)
        {
            var literals = Enumerable.Range(1, variables)
                .OrderBy(_ => random.Next())
                .Take(3)
                .Select(v => random.Next(2) == 0 ? v : -v)
                .ToArray();
            clauses[i] = WeightedClause.Soft(random.Next(1, 11), literals);
        }

        return new MaxSatProblem(variables, clauses);
    }

    /// <summary>The least cost over all 2^n assignments, or null when no assignment satisfies the hard clauses.</summary>
    public static long? ExhaustiveOptimum(MaxSatProblem problem)
    {
        long? best = null;
        var assignment = new bool[problem.VariableCount];
        for (var bits = 0L; bits < 1L << problem.VariableCount; bits++)
        {
            for (var v = 0; v < assignment.Length; v++)
            {
                assignment[v] = (bits >> v & 1) == 1;
            }

            if (problem.CostOf(assignment) is { } cost && (best is null || cost < best))
            {
                best = cost;
            }
        }

        return best;
    }
}
