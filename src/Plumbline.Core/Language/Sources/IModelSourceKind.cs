namespace Plumbline.Core.Language.Sources;

/// <summary>
/// One kind of place model answers come from (a recording file, an HTTP endpoint, a local model
/// folder ...). The composition root builds each kind with its own settings and registers it in a
/// <see cref="ModelSourceRegistry"/>; kinds know nothing of each other or of the engine.
/// </summary>
public interface IModelSourceKind
{
    /// <summary>A short lower-case name: "recording", "http" ...</summary>
    string Name { get; }

    /// <summary>How a source of this kind is written, for help and errors: "recording:PATH".</summary>
    string Spelling { get; }

    /// <summary>True when <paramref name="source"/> is written the way this kind expects (it may still be unusable).</summary>
    bool Recognises(string source);

    /// <summary>Who would answer, worked out from the source and the kind's settings alone (nothing is
    /// opened or contacted): what response-cache entries of this source are filed under.</summary>
    /// <exception cref="ModelSourceException">The source is malformed or lacks a setting it needs.</exception>
    ModelIdentity Identify(string source);

    /// <summary>
    /// Checks the source cheaply and opens it: a file is read and validated, an endpoint gets one
    /// small request, so that a set-up mistake costs nothing.
    /// </summary>
    /// <exception cref="ModelSourceException">The source cannot be used; the message is one line saying what to fix.</exception>
    Task<OpenedModel> OpenAsync(string source, ModelOpening opening, CancellationToken cancellationToken);
}
