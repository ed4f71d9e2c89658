using System.Text.Json;
using System.Text.Json.Serialization;

namespace Plumbline.Nli.Tests;

/// <summary>
/// The shipped model in the repository, models/nli-minilm-int8, and the reference files that the model recipe
/// writes beside it (reference/token-ids.jsonl from the recipe's Python WordPiece, reference/logits.jsonl from
/// its int8 emulation). Tests read whatever model and references are there, so a retrained model brings its own.
/// </summary>
internal static class RepositoryModel
{
    public static string RepositoryRoot { get; } = FindRoot();

    public static string Directory { get; } = Path.Combine(RepositoryRoot, "models", "nli-minilm-int8");

    public static string File(string name) => Path.Combine(Directory, name);

    public static IReadOnlyList<TokenReference> TokenReferences() => ReadLines<TokenReference>("token-ids.jsonl");

    public static IReadOnlyList<LogitReference> LogitReferences() => ReadLines<LogitReference>("logits.jsonl");

    private static T[] ReadLines<T>(string name) =>
        System.IO.File.ReadAllLines(Path.Combine(Directory, "reference", name))
            .Where(line => line.Length > 0)
            .Select(line => JsonSerializer.Deserialize<T>(line) ?? throw new InvalidDataException($"{name}: empty line"))
            .ToArray();

    private static string FindRoot()
    {
        for (var directory = new DirectoryInfo(AppContext.BaseDirectory); directory is not null; directory = directory.Parent)
        {
            if (System.IO.File.Exists(Path.Combine(directory.FullName, "Plumbline.slnx")))
            {
                return directory.FullName;
            }
        }

        throw new InvalidOperationException($"no Plumbline.slnx above {AppContext.BaseDirectory}");
    }
}

internal sealed record TokenReference(
    [property: JsonPropertyName("premise")] string Premise,
    [property: JsonPropertyName("hypothesis")] string Hypothesis,
    [property: JsonPropertyName("input_ids")] long[] InputIds,
    [property: JsonPropertyName("token_type_ids")] long[] TokenTypeIds);

internal sealed record LogitReference(
    [property: JsonPropertyName("premise")] string Premise,
    [property: JsonPropertyName("hypothesis")] string Hypothesis,
    [property: JsonPropertyName("int8_logits")] float[] Int8Logits);
