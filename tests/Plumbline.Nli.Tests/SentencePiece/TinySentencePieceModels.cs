using System.Text.Json;
using System.Text.Json.Serialization;

namespace Plumbline.Nli.Tests.SentencePiece;

/// <summary>
/// The tiny random-weight SentencePiece classifiers in models/tiny-nli (made by models/tiny-nli/build.py; see
/// models/tiny-nli/README.md). reference.jsonl: token ids from the sentencepiece library (Debian
/// python3-sentencepiece 0.1.97) framed as the model family does, and the logits PyTorch computes for them;
/// segments.jsonl: the sentencepiece library's ids for seeded random texts.
/// </summary>
internal static class TinySentencePieceModels
{
    public const string DebertaV3 = "deberta-v3";
    public const string DebertaV3Bpe = "deberta-v3-bpe";
    public const string XlmRoberta = "xlm-roberta";

    public static TheoryData<string> All => new() { DebertaV3, DebertaV3Bpe, XlmRoberta };

    public static string Directory(string name) => Path.Combine(RepositoryModel.RepositoryRoot, "models", "tiny-nli", name);

    public static string File(string name, string file) => Path.Combine(Directory(name), file);

    /// <summary>The folder's SentencePiece model file (spm.model or sentencepiece.bpe.model).</summary>
    public static string ModelFile(string name) => System.IO.Directory.GetFiles(Directory(name), "*.model").Single();

    public static IReadOnlyList<PairReference> Pairs(string name) => ReadLines<PairReference>(File(name, "reference.jsonl"));

    public static IReadOnlyList<SegmentReference> Segments(string name) => ReadLines<SegmentReference>(File(name, "segments.jsonl"));

    private static T[] ReadLines<T>(string path) =>
        System.IO.File.ReadAllLines(path)
            .Where(line => line.Length > 0)
            .Select(line => JsonSerializer.Deserialize<T>(line) ?? throw new InvalidDataException($"{path}: empty line"))
            .ToArray();
}

internal sealed record PairReference(
    [property: JsonPropertyName("premise")] string Premise,
    [property: JsonPropertyName("hypothesis")] string Hypothesis,
    [property: JsonPropertyName("input_ids")] long[] InputIds,
    [property: JsonPropertyName("token_type_ids")] long[] TokenTypeIds,
    [property: JsonPropertyName("truncated")] bool Truncated,
    [property: JsonPropertyName("logits")] double[] Logits);

internal sealed record SegmentReference(
    [property: JsonPropertyName("text")] string Text,
    [property: JsonPropertyName("ids")] int[] Ids);
