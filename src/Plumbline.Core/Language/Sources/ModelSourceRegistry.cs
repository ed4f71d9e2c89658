namespace Plumbline.Core.Language.Sources;

/// <summary>
/// The source kinds a run can use, in the order they are asked whether they recognise a
/// <c>--model</c> value; the first that does opens it. Adding a kind is one registration in the
/// composition root: neither the engine nor the other kinds change.
/// </summary>
public sealed class ModelSourceRegistry
{
    private readonly IModelSourceKind[] kinds;

    public ModelSourceRegistry(IEnumerable<IModelSourceKind> kinds)
    {
        ArgumentNullException.ThrowIfNull(kinds);
        this.kinds = [.. kinds];
        var twice = this.kinds.GroupBy(k => k.Name, StringComparer.Ordinal).FirstOrDefault(g => g.Count() > 1);
        if (twice is not null)
        {
            throw new ArgumentException($"model source kind '{twice.Key}' is registered twice", nameof(kinds));
        }
    }

    public IReadOnlyList<IModelSourceKind> Kinds => kinds;

    /// <summary>The spellings of every kind, for help and errors: "recording:PATH, URL".</summary>
    public string Spellings => string.Join(", ", kinds.Select(k => k.Spelling));

    /// <exception cref="ModelSourceException">The value is missing or no kind recognises it.</exception>
    public IModelSourceKind Resolve(string? source)
    {
        if (string.IsNullOrWhiteSpace(source))
        {
            throw new ModelSourceException($"--model: missing; say where the model's answers come from ({Spellings})");
        }

        return kinds.FirstOrDefault(k => k.Recognises(source))
            ?? throw new ModelSourceException($"--model: unknown model source '{source}' (known: {Spellings})");
    }

    /// <exception cref="ModelSourceException">The source is unknown or cannot be used.</exception>
    public Task<OpenedModel> OpenAsync(string? source, ModelOpening opening, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(opening);
        var kind = Resolve(source);
        return kind.OpenAsync(source!, opening, cancellationToken);
    }
}
