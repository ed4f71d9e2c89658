namespace Plumbline.Cli.Options;

/// <summary>Where the language model's answers come from, as given by <c>--model KIND:VALUE</c>.</summary>
internal abstract record ModelSource
{
    public const string OptionName = "--model";

    private static readonly string[] Known = ["recording:PATH", "onnx:DIR"];

    /// <exception cref="UsageException">The text is missing or names no known kind of source.</exception>
    public static ModelSource Parse(string? text)
    {
        if (string.IsNullOrWhiteSpace(text))
        {
            throw new UsageException($"{OptionName}: missing; say where the model's answers come from ({string.Join(", ", Known)})");
        }

        var colon = text.IndexOf(':', StringComparison.Ordinal);
        var kind = colon < 0 ? text : text[..colon];
        var value = colon < 0 ? string.Empty : text[(colon + 1)..];
        return kind.ToLowerInvariant() switch
        {
            "recording" when value.Length > 0 => new RecordingModelSource(value),
            "recording" => throw new UsageException($"{OptionName}: 'recording:' needs the recording file's path"),
            "onnx" when value.Length > 0 => new LocalModelSource(value),
            "onnx" => throw new UsageException($"{OptionName}: 'onnx:' needs the model folder's path"),
            _ => throw new UsageException($"{OptionName}: unknown model source '{text}' (known: {string.Join(", ", Known)})"),
        };
    }
}

/// <summary>Replay answers from a recording file.</summary>
internal sealed record RecordingModelSource(string Path) : ModelSource;

/// <summary>Run a decoder-only ONNX model from a folder in this process (see src/Plumbline.LocalModel/README.md).</summary>
/// <param name="Directory">The model folder.</param>
/// <param name="Threads">Threads per model run; null for every core.</param>
/// <param name="Seed">Sampling seed; null for fresh randomness.</param>
internal sealed record LocalModelSource(string Directory, int? Threads = null, int? Seed = null) : ModelSource;
