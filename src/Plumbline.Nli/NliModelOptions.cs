namespace Plumbline.Nli;

/// <summary>How ONNX Runtime runs the model.</summary>
public sealed record NliModelOptions
{
    /// <summary>
    /// Threads inside one operator. One by default: a batch of a few dozen short pairs is too small to split well
    /// across cores, so the cores instead run separate batches at once (<see cref="ConcurrentRuns"/>). On the
    /// 2-core machine the pipeline-throughput benchmark judged 56.0 and 59.1 claims/min with one thread per batch
    /// against 50.2 and 51.1 with two (alternating, one sitting), before batches of one call ran in parallel.
    /// </summary>
    public int IntraOpThreads { get; init; } = 1;

    /// <summary>Most batches running at once across every caller of the model; by default one per core's share of
    /// <see cref="IntraOpThreads"/>.</summary>
    public int? ConcurrentRuns { get; init; }

    internal int EffectiveConcurrentRuns => ConcurrentRuns ?? Math.Max(1, Environment.ProcessorCount / Math.Max(1, IntraOpThreads));
}
