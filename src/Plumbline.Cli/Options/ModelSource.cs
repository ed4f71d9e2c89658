namespace Plumbline.Cli.Options;

/// <summary>Where the language model's answers come from, as given by <c>--model KIND:VALUE</c>.</summary>
internal abstract record ModelSource
{
    public const string OptionName = "--model";

    private static readonly string[] Known = ["recording:PATH"];

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
            _ => throw new UsageException($"{OptionName}: unknown model source '{text}' (known: {string.Join(", ", Known)})"),
        };
    }
}

/// <summary>Replay answers from a recording file.</summary>
internal sealed record RecordingModelSource(string Path) : ModelSource;
