namespace Plumbline.Nli;

/// <summary>How ONNX Runtime runs the model.</summary>
public sealed record NliModelOptions
{
    /// <summary>
    /// Threads inside one operator. One by default: a batch of a few dozen short pairs is too small to split well
    /// across cores, so the cores instead run separate batches at once (<see cref="ConcurrentRuns"/>). On the
    /// 2-core machine the pipeline-throughput benchmark judged 65.3, 65.0 and 65.1 claims/min this way against
    /// 57.4, 51.3 and 54.1 with two threads per batch (alternating, one sitting).
    /// </summary>
    public int IntraOpThreads { get; init; } = 1;

    /// <summary>Most batches running at once across every caller of the model; by default one per core's share of
    /// <see cref="IntraOpThreads"/>.</summary>
    public int? ConcurrentRuns { get; init; }

    internal int EffectiveConcurrentRuns => ConcurrentRuns ?? Math.Max(1, Environment.ProcessorCount / IntraOpThreads);
}
