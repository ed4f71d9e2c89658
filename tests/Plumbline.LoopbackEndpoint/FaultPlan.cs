namespace Plumbline.LoopbackEndpoint;

/// <summary>Chooses a fault (or none) for each request: by the request's sequence number and its prompt.</summary>
public delegate Fault FaultPlan(int sequence, string prompt);

/// <summary>Ready-made plans.</summary>
public static class FaultPlans
{
    public static FaultPlan None { get; } = (_, _) => Fault.None;

    /// <summary>Each request is faulty with probability <paramref name="rate"/>, the fault drawn evenly from
    /// <paramref name="faults"/>, from a seeded generator so a failing run can be replayed.</summary>
    public static FaultPlan Random(double rate, int seed, params Fault[] faults)
    {
        var random = new Random(seed);
        var gate = new Lock();
        return (_, _) =>
        {
            lock (gate)
            {
                return random.NextDouble() < rate ? faults[random.Next(faults.Length)] : Fault.None;
            }
        };
    }

    /// <summary>Every request whose prompt mentions <paramref name="text"/> gets <paramref name="fault"/>; the rest follow <paramref name="otherwise"/>.</summary>
    public static FaultPlan Always(string text, Fault fault, FaultPlan otherwise) =>
        (sequence, prompt) => prompt.Contains(text, StringComparison.Ordinal) ? fault : otherwise(sequence, prompt);

    /// <summary>Follows <paramref name="inner"/>, but a prompt that has already been given <paramref name="count"/>
    /// faults gets none: a test that must end in success stays certain to, however concurrent requests
    /// happen to draw from a seeded plan.</summary>
    public static FaultPlan AtMostPerPrompt(int count, FaultPlan inner)
    {
        var given = new Dictionary<string, int>(StringComparer.Ordinal);
        var gate = new Lock();
        return (sequence, prompt) =>
        {
            lock (gate)
            {
                var so = given.GetValueOrDefault(prompt);
                if (so >= count)
                {
                    return Fault.None;
                }

                var fault = inner(sequence, prompt);
                if (fault != Fault.None)
                {
                    given[prompt] = so + 1;
                }

                return fault;
            }
        };
    }

    /// <summary>The first <paramref name="count"/> requests get <paramref name="fault"/>.</summary>
    public static FaultPlan First(int count, Fault fault) => (sequence, _) => sequence <= count ? fault : Fault.None;
}
