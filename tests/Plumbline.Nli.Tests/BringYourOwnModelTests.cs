using System.Text.Json;
using System.Text.Json.Serialization;
using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

/// <summary>
/// Model directories described by a config.json instead of our card. The byte-level BPE case uses the tiny
/// classifier in data/tiny-bpe (made by make_tiny_bpe.py: hand-derived token ids, numpy logits).
/// </summary>
public sealed class BringYourOwnModelTests
{
    private static readonly string TinyBpe = Path.Combine(AppContext.BaseDirectory, "data", "tiny-bpe");

    [Fact]
    public void Load_ByteLevelBpeConfig_ReadsLabelsLengthAndTokenizerFromConfig()
    {
        using var model = NliModel.Load(TinyBpe);

        Assert.Equal(NliTokenizerKind.ByteLevelBpe, model.Card.Tokenizer);
        Assert.Equal(["CONTRADICTION", "NEUTRAL", "ENTAILMENT"], model.Card.Labels);
        Assert.Equal(16, model.Card.MaxLength);
        Assert.False(model.Card.LowerCase);
        Assert.Equal("tiny-bpe-pair-classifier", model.Card.Name);
    }

    [Fact]
    public void Encode_ByteLevelBpe_UsesDoubleSeparatorFrameAndHandDerivedIds()
    {
        using var model = NliModel.Load(TinyBpe);

        foreach (var expected in Expected())
        {
            var encoded = model.Encode(new SentencePair(expected.Premise, expected.Hypothesis));
            Assert.Equal(expected.InputIds, encoded.InputIds);
            Assert.All(encoded.TypeIds, type => Assert.Equal(0, type));
        }
    }

    [Fact]
    public async Task ScoreAsync_GraphWithoutTokenTypeIds_MatchesNumpyLogitsInConfigLabelOrder()
    {
        using var scorer = OnnxEntailmentScorer.Load(TinyBpe, new NliScorerOptions { Cache = false });
        var expected = Expected();

        // One batch of different lengths: padding must stay out of the graph's masked mean.
        var scored = await scorer.ScorePairsAsync(expected.Select(e => new SentencePair(e.Premise, e.Hypothesis)).ToArray(), CancellationToken.None);

        for (var i = 0; i < expected.Count; i++)
        {
            for (var label = 0; label < 3; label++)
            {
                Assert.Equal(expected[i].Logits[label], scored[i].Logits[label], 1e-5);
            }

            // id2label is contradiction, neutral, entailment.
            var exp = expected[i].Logits.Select(Math.Exp).ToArray();
            Assert.Equal(exp[2] / exp.Sum(), scored[i].Scores.Entailment, 1e-6);
            Assert.Equal(exp[0] / exp.Sum(), scored[i].Scores.Contradiction, 1e-6);
        }
    }

    [Fact]
    public async Task ScoreAsync_ByteLevelBpePairOverMaxLength_IsCutAndCounted()
    {
        using var scorer = OnnxEntailmentScorer.Load(TinyBpe);
        var longText = string.Join(' ', Enumerable.Repeat("the cat sat", 8));

        var result = (await scorer.ScoreWithDetailsAsync([new SentencePair(longText, "cat")], CancellationToken.None))[0];

        Assert.True(result.Truncated);
        Assert.Equal(1, scorer.TruncatedPairs);
        Assert.Equal(16, scorer.Model.Encode(new SentencePair(longText, "cat")).Length);
    }

    [Fact]
    public async Task Load_WordPieceModelDescribedByConfigJson_ScoresLikeOurCard()
    {
        // The repository model again, but described as an exported classifier would be: id2label only.
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("config.json", """{ "model_type": "bert", "max_position_embeddings": 512, "id2label": { "0": "entailment", "1": "neutral", "2": "contradiction" } }""")
            .Write("tokenizer_config.json", """{ "do_lower_case": true, "model_max_length": 128 }""");
        using var fromConfig = OnnxEntailmentScorer.Load(directory.Path);
        using var fromCard = OnnxEntailmentScorer.Load(RepositoryModel.Directory);
        SentencePair[] pairs = [new("Naïve résumé écrit à Zürich", "NAÏVE RÉSUMÉ"), new("A dog runs.", "An animal moves.")];

        // Logits, not probabilities: our card also carries a calibration temperature, which config.json does not.
        var expected = await fromCard.ScorePairsAsync(pairs, CancellationToken.None);
        var actual = await fromConfig.ScorePairsAsync(pairs, CancellationToken.None);

        Assert.Equal(128, fromConfig.Model.Card.MaxLength);
        Assert.True(fromConfig.Model.Card.LowerCase);
        Assert.Equal(1.0, fromConfig.Model.Card.Temperature);
        Assert.Equal(fromCard.Model.Encode(pairs[0]).InputIds, fromConfig.Model.Encode(pairs[0]).InputIds);
        for (var i = 0; i < pairs.Length; i++)
        {
            Assert.Equal(expected[i].Logits, actual[i].Logits);
        }
    }

    [Fact]
    public void Load_BpeVocabularyWithoutFrameTokens_NamesVocabulary()
    {
        using var directory = new TempModelDirectory().CopyFrom(TinyBpe);
        var vocabulary = JsonSerializer.Deserialize<Dictionary<string, int>>(File.ReadAllText(directory.File("vocab.json")))!;
        vocabulary.Remove("<s>");
        directory.Write("vocab.json", JsonSerializer.Serialize(vocabulary));

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        Assert.Equal(directory.File("vocab.json"), error.FilePath);
    }

    [Fact]
    public void Load_BpeWithoutMerges_NamesMergesFile()
    {
        using var directory = new TempModelDirectory().CopyFrom(TinyBpe);
        File.Delete(directory.File("merges.txt"));

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        Assert.Equal(directory.File("merges.txt"), error.FilePath);
    }

    private static IReadOnlyList<BpeExpectation> Expected() =>
        File.ReadAllLines(Path.Combine(TinyBpe, "expected.jsonl"))
            .Where(line => line.Length > 0)
            .Select(line => JsonSerializer.Deserialize<BpeExpectation>(line)!)
            .ToArray();

    private sealed record BpeExpectation(
        [property: JsonPropertyName("premise")] string Premise,
        [property: JsonPropertyName("hypothesis")] string Hypothesis,
        [property: JsonPropertyName("input_ids")] long[] InputIds,
        [property: JsonPropertyName("logits")] double[] Logits);
}
