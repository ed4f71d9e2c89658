using System.Globalization;
using System.Text;
using Plumbline.Cli.Options;
using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;
using Plumbline.LocalModel;

namespace Plumbline.Cli.Composition;

/// <summary>
/// Model sources written <c>onnx:DIR</c>: a decoder-only ONNX model folder run in this process. Its
/// identity names the folder, a fingerprint of the folder's files (name, size, time written, so a
/// replaced model misses the cache) and the seed.
/// </summary>
internal sealed class LocalSourceKind(int? threads, int? seed) : IModelSourceKind
{
    public string Name => "local";

    public string Spelling => ModelOptions.LocalSourceKindPrefix + "DIR";

    public bool Recognises(string source) => source.StartsWith(ModelOptions.LocalSourceKindPrefix, StringComparison.OrdinalIgnoreCase);

    public ModelIdentity Identify(string source)
    {
        var folder = Path.GetFullPath(FolderOf(source));
        var files = new StringBuilder();
        if (Directory.Exists(folder))
        {
            foreach (var file in new DirectoryInfo(folder).GetFiles().OrderBy(f => f.Name, StringComparer.Ordinal))
            {
                files.Append(CultureInfo.InvariantCulture, $"{file.Name}:{file.Length}:{file.LastWriteTimeUtc.Ticks};");
            }
        }

        return new ModelIdentity("local", folder,
        [
            new("files", RequestFingerprint.HashOf(files.ToString())),
            new("seed", seed?.ToString(CultureInfo.InvariantCulture) ?? "none"),
        ]);
    }

    /// <exception cref="LocalModelException">The folder cannot be used (reported as a usage error naming it).</exception>
    public Task<OpenedModel> OpenAsync(string source, ModelOpening opening, CancellationToken cancellationToken)
    {
        var model = LocalLanguageModel.Open(FolderOf(source), new LocalModelOptions(Threads: threads, Seed: seed));
        return Task.FromResult(new OpenedModel(model, Identify(source), Cacheable: true, []));
    }

    private static string FolderOf(string source)
    {
        var folder = source[ModelOptions.LocalSourceKindPrefix.Length..];
        return folder.Length > 0 ? folder : throw new ModelSourceException("--model: 'onnx:' needs the model folder's path");
    }
}
