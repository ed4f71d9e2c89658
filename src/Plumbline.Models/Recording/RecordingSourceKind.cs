using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;

namespace Plumbline.Models.Recording;

/// <summary>Model sources written <c>recording:PATH</c>: answers replayed from a recording file, read and
/// validated whole when opened.</summary>
public sealed class RecordingSourceKind : IModelSourceKind
{
    private const string Prefix = "recording:";

    public string Name => "recording";

    public string Spelling => "recording:PATH";

    public bool Recognises(string source) => source.StartsWith(Prefix, StringComparison.OrdinalIgnoreCase);

    public ModelIdentity Identify(string source) => new("recording", Path.GetFullPath(PathOf(source)));

    public async Task<OpenedModel> OpenAsync(string source, ModelOpening opening, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(opening);
        var path = PathOf(source);
        if (!File.Exists(path))
        {
            throw new ModelSourceException($"--model: recording file '{path}' not found");
        }

        var model = await RecordingLanguageModel.LoadAsync(path, opening.PromptVersion, cancellationToken).ConfigureAwait(false);
        return OpenedModel.Stored(model, Identify(source));
    }

    private static string PathOf(string source)
    {
        var path = source[Prefix.Length..];
        return path.Length > 0 ? path : throw new ModelSourceException("--model: 'recording:' needs the recording file's path");
    }
}
