using System.Text.Json;
using System.Text.Json.Serialization;

namespace Plumbline.LocalModel.Tests;

/// <summary>
/// The tiny random decoder in models/tiny-decoder and the reference outputs its recipe
/// (models/decoder-recipe/make_decoder.py) computed in PyTorch, recomputing every step from scratch
/// (no key/value cache): token ids of sample texts, greedy continuations, next-token probabilities and
/// True/False masses after answer prompts.
/// </summary>
internal static class TinyModel
{
    public static string RepositoryRoot { get; } = FindRoot();

    public static string Directory { get; } = Path.Combine(RepositoryRoot, "models", "tiny-decoder");

    public static string NliDirectory { get; } = Path.Combine(RepositoryRoot, "models", "nli-minilm-int8");

    public static Reference Reference { get; } = JsonSerializer.Deserialize<Reference>(
        File.ReadAllText(Path.Combine(Directory, "reference", "reference.json")))
        ?? throw new InvalidDataException("reference.json is empty");

    /// <summary>One model for the tests of a class; opening takes a fraction of a second.</summary>
    public static LocalLanguageModel Open(LocalModelOptions? options = null) => LocalLanguageModel.Open(Directory, options);

    private static string FindRoot()
    {
        for (var directory = new DirectoryInfo(AppContext.BaseDirectory); directory is not null; directory = directory.Parent)
        {
            if (File.Exists(Path.Combine(directory.FullName, "Plumbline.slnx")))
            {
                return directory.FullName;
            }
        }

        throw new InvalidOperationException($"no Plumbline.slnx above {AppContext.BaseDirectory}");
    }
}

internal sealed record Reference(
    [property: JsonPropertyName("tokens")] TokenCase[] Tokens,
    [property: JsonPropertyName("greedy")] GreedyCase[] Greedy,
    [property: JsonPropertyName("answers")] AnswerCase[] Answers);

internal sealed record TokenCase(
    [property: JsonPropertyName("text")] string Text,
    [property: JsonPropertyName("ids")] int[] Ids);

internal sealed record GreedyCase(
    [property: JsonPropertyName("prompt")] string Prompt,
    [property: JsonPropertyName("prompt_ids")] int[] PromptIds,
    [property: JsonPropertyName("max_tokens")] int MaxTokens,
    [property: JsonPropertyName("ids")] int[] Ids,
    [property: JsonPropertyName("text")] string Text);

internal sealed record AnswerCase(
    [property: JsonPropertyName("statement")] string Statement,
    [property: JsonPropertyName("prompt")] string Prompt,
    [property: JsonPropertyName("prompt_ids")] int[] PromptIds,
    [property: JsonPropertyName("next_token_probabilities")] double[] NextTokenProbabilities,
    [property: JsonPropertyName("true_sequences")] int[][] TrueSequences,
    [property: JsonPropertyName("false_sequences")] int[][] FalseSequences,
    [property: JsonPropertyName("true_mass")] double TrueMass,
    [property: JsonPropertyName("false_mass")] double FalseMass,
    [property: JsonPropertyName("p_true")] double PTrue);
