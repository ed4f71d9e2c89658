using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;

namespace Plumbline.LocalModel;

/// <summary>
/// Model sources written <c>onnx:DIR</c>: a decoder-only model folder in ONNX Runtime GenAI's layout, run in
/// this process. Opening checks the folder, loads the model and runs it on one token, so that a folder that
/// cannot be used is refused before any claim is spent.
/// </summary>
public sealed class LocalSourceKind(LocalModelOptions options) : IModelSourceKind
{
    public const string Prefix = "onnx:";

    public string Name => "onnx";

    public string Spelling => "onnx:DIR";

    public bool Recognises(string source)
    {
        ArgumentNullException.ThrowIfNull(source);
        return source.StartsWith(Prefix, StringComparison.OrdinalIgnoreCase);
    }

    /// <summary>
    /// The folder's full path, the sampling seed, and a digest of the folder's files (names, sizes and
    /// modification times; their contents are not read), so that cached answers of one model are not served
    /// after the folder's files change.
    /// </summary>
    public ModelIdentity Identify(string source)
    {
        var directory = Path.GetFullPath(DirectoryOf(source));
        return new ModelIdentity(Name, directory,
        [
            new("files", FilesDigest(directory)),
            new("seed", options.Seed?.ToString(CultureInfo.InvariantCulture) ?? "none"),
        ]);
    }

    public async Task<OpenedModel> OpenAsync(string source, ModelOpening opening, CancellationToken cancellationToken)
    {
        var directory = DirectoryOf(source);
        LocalLanguageModel model;
        try
        {
            // Loading a large model takes seconds of CPU; keep it off the caller's thread.
            model = await Task.Run(() => LocalLanguageModel.Open(directory, options), cancellationToken).ConfigureAwait(false);
        }
        catch (LocalModelException e)
        {
            throw new ModelSourceException("--model: " + e.Message, e);
        }

        IReadOnlyList<string> notices = model.UsesChatTemplate
            ? [$"{model.Describe}: prompts are wrapped in the folder's chat template as one user message"]
            : [];
        return new OpenedModel(model, Identify(source), Cacheable: true, notices);
    }

    private static string DirectoryOf(string source)
    {
        ArgumentNullException.ThrowIfNull(source);
        var directory = source[Prefix.Length..];
        return directory.Length > 0 ? directory : throw new ModelSourceException("--model: 'onnx:' needs the model folder's path");
    }

    private static string FilesDigest(string directory)
    {
        if (!System.IO.Directory.Exists(directory))
        {
            return "missing";
        }

        var listing = new StringBuilder();
        foreach (var file in new DirectoryInfo(directory).EnumerateFiles().OrderBy(f => f.Name, StringComparer.Ordinal))
        {
            listing.Append(file.Name).Append('\0')
                .Append(file.Length.ToString(CultureInfo.InvariantCulture)).Append('\0')
                .Append(file.LastWriteTimeUtc.Ticks.ToString(CultureInfo.InvariantCulture)).Append('\n');
        }

        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(listing.ToString())))[..16];
    }
}
