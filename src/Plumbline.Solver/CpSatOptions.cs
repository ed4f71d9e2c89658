namespace Plumbline.Solver;

/// <summary>Search settings for <see cref="CpSatMaxSatSolver"/>.</summary>
/// <param name="Workers">Parallel CP-SAT workers; a small number keeps a shared machine usable. With 2 or more, one of
/// them runs core-guided search, which suits MAX-SAT objectives; a single worker is markedly slower on hard instances.</param>
/// <param name="TimeLimit">Stop after this long and report the best solution found; null searches until optimality is proven.</param>
public sealed record CpSatOptions(int Workers = 2, TimeSpan? TimeLimit = null)
{
    public static CpSatOptions Default { get; } = new();

    internal void Validate()
    {
        if (Workers < 1)
        {
            throw new ArgumentOutOfRangeException(nameof(Workers), Workers, "CP-SAT needs at least one worker.");
        }

        if (TimeLimit is { } limit && limit <= TimeSpan.Zero)
        {
            throw new ArgumentOutOfRangeException(nameof(TimeLimit), limit, "A time limit must be positive.");
        }
    }

    internal string ToParameterString()
    {
        // CP-SAT would otherwise install its own SIGINT handler during a solve and leave the default one behind,
        // so a later Ctrl+C killed the host process before it could write the verdicts it had finished.
        var text = $"num_workers:{Workers} catch_sigint_signal:false";
        if (Workers >= 2)
        {
            // A MAX-SAT objective is a weighted sum of violation indicators, where core-guided search proves optima
            // fastest; CP-SAT's portfolio for 2 workers leaves its core worker out (measured: an instance that
            // took over a minute unproven with the default pair is proven in under a second with the core worker).
            text += " extra_subsolvers:\"core\"";
        }

        if (TimeLimit is { } limit)
        {
            text += $" max_time_in_seconds:{limit.TotalSeconds.ToString("R", System.Globalization.CultureInfo.InvariantCulture)}";
        }

        return text;
    }
}
