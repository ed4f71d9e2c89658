namespace Plumbline.Nli;

/// <summary>How ONNX Runtime runs the model.</summary>
public sealed record NliModelOptions
{
    /// <summary>
    /// Threads inside one operator; all cores by default. With several claims in flight batches can run at once and
    /// then share these cores; smaller pools per batch were not measured.
    /// </summary>
    public int IntraOpThreads { get; init; } = Environment.ProcessorCount;
}
