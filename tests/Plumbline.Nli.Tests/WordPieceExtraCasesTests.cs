using System.Security.Cryptography;
using System.Text.Json;
using Plumbline.Nli.Tokenization;

namespace Plumbline.Nli.Tests;

/// <summary>
/// Our WordPiece on Unicode edge cases against the recipe's reference tokenizer (models/recipe/wordpiece.py),
/// via data/wordpiece-extra/cases.jsonl over the repository model's vocab.txt.
/// </summary>
public sealed class WordPieceExtraCasesTests
{
    [Fact]
    public void Encode_UnicodeEdgeCases_MatchReferenceTokenizer()
    {
        var lines = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "data", "wordpiece-extra", "cases.jsonl"));
        var vocabularyFile = RepositoryModel.File("vocab.txt");
        var recordedHash = JsonDocument.Parse(lines[0]).RootElement.GetProperty("vocab_sha256").GetString();
        Assert.True(
            recordedHash == Convert.ToHexStringLower(SHA256.HashData(File.ReadAllBytes(vocabularyFile))),
            "vocab.txt differs from the one cases.jsonl was made with; rerun data/wordpiece-extra/make_extra_cases.py");
        var tokenizer = new WordPieceTokenizer(WordPieceVocabulary.Load(vocabularyFile), lowerCase: true);

        var mismatches = new List<string>();
        foreach (var line in lines.Skip(1))
        {
            var row = JsonDocument.Parse(line).RootElement;
            var text = row.GetProperty("text").GetString()!;
            var expected = row.GetProperty("ids").EnumerateArray().Select(id => id.GetInt32()).ToArray();
            var actual = tokenizer.Encode(text);
            if (!actual.SequenceEqual(expected))
            {
                mismatches.Add($"{JsonSerializer.Serialize(text)}: ours [{string.Join(' ', actual)}], reference [{string.Join(' ', expected)}]");
            }
        }

        Assert.True(lines.Length > 1);
        Assert.True(mismatches.Count == 0, string.Join(Environment.NewLine, mismatches));
    }

    [Fact]
    public void Encode_CasedVocabulary_KeepsCaseAndAccents()
    {
        var tokenizer = new WordPieceTokenizer(WordPieceVocabulary.Load(RepositoryModel.File("vocab.txt")), lowerCase: false);
        var uncased = new WordPieceTokenizer(WordPieceVocabulary.Load(RepositoryModel.File("vocab.txt")), lowerCase: true);

        // The uncased vocabulary has "cafe" but neither "Cafe" nor "café": without folding the word is unknown.
        Assert.Equal(uncased.Encode("cafe"), uncased.Encode("Café"));
        Assert.NotEqual(uncased.Encode("Café"), tokenizer.Encode("Café"));
    }
}
