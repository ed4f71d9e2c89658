namespace Plumbline.LocalModel;

/// <summary>How a local model runs on this machine.</summary>
/// <param name="Threads">Threads each model run may use (ONNX Runtime's intra-op threads); null lets the runtime
/// take every core.</param>
/// <param name="Concurrency">Requests computed at the same time; null gives one per <paramref name="Threads"/>
/// cores, so that the threads in use add up to the machine's cores.</param>
/// <param name="Seed">Base of the sampling seeds; each request's seed is derived from it and the request, so a
/// run's samples do not depend on the order requests arrive in. Null draws fresh seeds.</param>
/// <param name="AvailableMemory">Bytes of memory the model may take; null reads what the system reports.</param>
public sealed record LocalModelOptions(
    int? Threads = null,
    int? Concurrency = null,
    int? Seed = null,
    long? AvailableMemory = null)
{
    public static LocalModelOptions Default { get; } = new();

    internal int EffectiveConcurrency =>
        Concurrency ?? Math.Max(1, Environment.ProcessorCount / Math.Max(1, Threads ?? Environment.ProcessorCount));
}
