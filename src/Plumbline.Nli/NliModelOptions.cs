namespace Plumbline.Nli;

/// <summary>How ONNX Runtime runs the model.</summary>
public sealed record NliModelOptions
{
    /// <summary>Threads inside one operator; all cores by default, since one batch runs at a time.</summary>
    public int IntraOpThreads { get; init; } = Environment.ProcessorCount;
}
