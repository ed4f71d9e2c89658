using Plumbline.Core.Entailment;
using Plumbline.Nli.Tokenization;
using static Plumbline.Nli.Tests.SentencePiece.TinySentencePieceModels;

namespace Plumbline.Nli.Tests.SentencePiece;

/// <summary>
/// DeBERTa-v3 and XLM-R shaped exports load from their folders alone and tokenise exactly as the sentencepiece
/// library does; the tiny models give the logits PyTorch gave (references in models/tiny-nli, see
/// <see cref="TinySentencePieceModels"/>).
/// </summary>
public sealed class SentencePieceModelTests
{
    [Theory]
    [MemberData(nameof(All), MemberType = typeof(TinySentencePieceModels))]
    public void Segment_SeededRandomTexts_EqualTheSentencePieceLibrarysIds(string name)
    {
        var segmenter = SentencePieceSegmenter.Create(SentencePieceModelFile.Read(ModelFile(name)));
        var references = Segments(name);
        Assert.True(references.Count >= 300);

        var mismatches = references
            .Select(reference => (reference, ours: segmenter.Encode(reference.Text)))
            .Where(result => !result.ours.SequenceEqual(result.reference.Ids))
            .Select(result => $"{result.reference.Text}: ours [{string.Join(' ', result.ours)}], sentencepiece [{string.Join(' ', result.reference.Ids)}]")
            .ToArray();

        Assert.True(mismatches.Length == 0, $"{mismatches.Length} of {references.Count} differ:{Environment.NewLine}{string.Join(Environment.NewLine, mismatches.Take(10))}");
    }

    [Theory]
    [MemberData(nameof(All), MemberType = typeof(TinySentencePieceModels))]
    public void Encode_ReferencePairs_EqualSentencePieceIdsInTheFamilysFrame(string name)
    {
        using var model = NliModel.Load(Directory(name));

        var mismatches = new List<string>();
        foreach (var reference in Pairs(name))
        {
            var encoded = model.Encode(new SentencePair(reference.Premise, reference.Hypothesis));
            if (!encoded.InputIds.SequenceEqual(reference.InputIds) || !encoded.TypeIds.SequenceEqual(reference.TokenTypeIds))
            {
                mismatches.Add($"({reference.Premise} | {reference.Hypothesis}): ours [{string.Join(' ', encoded.InputIds)}] types [{string.Join(' ', encoded.TypeIds)}], reference [{string.Join(' ', reference.InputIds)}] types [{string.Join(' ', reference.TokenTypeIds)}]");
            }

            Assert.Equal(reference.Truncated, encoded.Truncated);
        }

        Assert.True(mismatches.Count == 0, string.Join(Environment.NewLine, mismatches));
    }

    [Theory]
    [MemberData(nameof(All), MemberType = typeof(TinySentencePieceModels))]
    public void Encode_FromManyThreadsAtOnce_GivesTheReferenceIds(string name)
    {
        // The scorer tokenises from several threads; the segmenters keep no state between calls.
        using var model = NliModel.Load(Directory(name));
        var references = Pairs(name);

        var wrong = 0;
        Parallel.For(0, references.Count * 8, new ParallelOptions { MaxDegreeOfParallelism = 8 }, i =>
        {
            var reference = references[i % references.Count];
            if (!model.Encode(new SentencePair(reference.Premise, reference.Hypothesis)).InputIds.SequenceEqual(reference.InputIds))
            {
                Interlocked.Increment(ref wrong);
            }
        });

        Assert.Equal(0, wrong);
    }

    [Theory]
    [MemberData(nameof(All), MemberType = typeof(TinySentencePieceModels))]
    public void Encode_PairsLongerThanMaxLength_AreCutToMaxLength(string name)
    {
        using var model = NliModel.Load(Directory(name));
        var cut = Pairs(name).Where(reference => reference.Truncated).ToArray();
        Assert.NotEmpty(cut);

        Assert.All(cut, reference => Assert.Equal(model.Card.MaxLength, model.Encode(new SentencePair(reference.Premise, reference.Hypothesis)).Length));
    }

    [Theory]
    [MemberData(nameof(All), MemberType = typeof(TinySentencePieceModels))]
    public async Task ScorePairsAsync_ReferencePairsInOneBatch_GiveThePyTorchLogits(string name)
    {
        using var scorer = OnnxEntailmentScorer.Load(Directory(name), new NliScorerOptions { Cache = false });
        var references = Pairs(name);

        // One call with pairs of many lengths: padding must stay out of every row's logits.
        var scored = await scorer.ScorePairsAsync(references.Select(r => new SentencePair(r.Premise, r.Hypothesis)).ToArray(), CancellationToken.None);

        for (var i = 0; i < references.Count; i++)
        {
            for (var label = 0; label < 3; label++)
            {
                Assert.Equal(references[i].Logits[label], scored[i].Logits[label], 1e-4);
            }
        }
    }

    // Indices of entailment, neutral and contradiction in each folder's config.json id2label, read off by hand.
    [Theory]
    [InlineData(DebertaV3, 1, 2, 0)]     // contradiction, entailment, neutral
    [InlineData(DebertaV3Bpe, 2, 0, 1)]  // neutral, contradiction, entailment
    [InlineData(XlmRoberta, 2, 1, 0)]    // CONTRADICTION, NEUTRAL, ENTAILMENT
    public async Task ScoreAsync_LabelOrderOfConfigJson_PutsEachLogitOnItsClass(string name, int entailment, int neutral, int contradiction)
    {
        using var scorer = OnnxEntailmentScorer.Load(Directory(name));
        var references = Pairs(name);

        var scores = await scorer.ScoreAsync(references.Select(r => new SentencePair(r.Premise, r.Hypothesis)).ToArray(), CancellationToken.None);

        for (var i = 0; i < references.Count; i++)
        {
            var exp = references[i].Logits.Select(Math.Exp).ToArray();
            Assert.Equal(exp[entailment] / exp.Sum(), scores[i].Entailment, 1e-4);
            Assert.Equal(exp[neutral] / exp.Sum(), scores[i].Neutral, 1e-4);
            Assert.Equal(exp[contradiction] / exp.Sum(), scores[i].Contradiction, 1e-4);
        }
    }

    [Fact]
    public void Load_DebertaV3Export_FindsSpmModelAndReadsConfigAndTokenizerConfig()
    {
        using var model = NliModel.Load(Directory(DebertaV3));

        Assert.Equal(NliTokenizerKind.SentencePiece, model.Card.Tokenizer);
        Assert.Equal(File(DebertaV3, "spm.model"), model.Card.VocabularyFile);
        Assert.Equal(["contradiction", "entailment", "neutral"], model.Card.Labels);
        Assert.Equal(64, model.Card.MaxLength);  // max_position_embeddings; tokenizer_config has the no-limit sentinel
        Assert.False(model.Card.LowerCase);
        Assert.Equal("tiny-deberta-v3-nli", model.Card.Name);
    }

    [Fact]
    public void Load_XlmRobertaExport_FindsSentencePieceBpeModelAndLeavesTwoPositionRows()
    {
        using var model = NliModel.Load(Directory(XlmRoberta));

        Assert.Equal(NliTokenizerKind.SentencePiece, model.Card.Tokenizer);
        Assert.Equal(File(XlmRoberta, "sentencepiece.bpe.model"), model.Card.VocabularyFile);
        Assert.Equal(64, model.Card.MaxLength);  // max_position_embeddings 66 less the two rows before position 0
        Assert.Equal(["CONTRADICTION", "NEUTRAL", "ENTAILMENT"], model.Card.Labels);
    }

    [Fact]
    public void Load_OurCardWithoutLabels_TakesLabelsFromConfigJsonBesideIt()
    {
        using var model = NliModel.Load(Directory(DebertaV3Bpe));

        Assert.Equal(NliTokenizerKind.SentencePiece, model.Card.Tokenizer);
        Assert.Equal("tiny-deberta-v3-bpe-nli", model.Card.Name);
        Assert.Equal(40, model.Card.MaxLength);
        Assert.Equal(["neutral", "contradiction", "entailment"], model.Card.Labels);
    }

    [Fact]
    public void Load_ExportWithACardGivingOnlyMaxLength_KeepsEverythingElseFromTheExport()
    {
        // A one-line card is how a user caps the length of a brought model; the rest still comes from the export.
        using var directory = new TempModelDirectory().CopyFrom(Directory(DebertaV3)).Write("nli-model.json", """{ "max_length": 24 }""");
        using var model = NliModel.Load(directory.Path);

        Assert.Equal(24, model.Card.MaxLength);
        Assert.Equal(NliTokenizerKind.SentencePiece, model.Card.Tokenizer);
        Assert.Equal(["contradiction", "entailment", "neutral"], model.Card.Labels);
        Assert.Equal(24, model.Encode(new SentencePair(Pairs(DebertaV3)[^1].Premise, "x")).Length);
    }

    // Padding ids: [PAD] is piece 0 of a DeBERTa-v3 model; the fairseq dictionary of XLM-R puts <pad> at 1.
    [Theory]
    [InlineData(DebertaV3, 0)]
    [InlineData(XlmRoberta, 1)]
    public void CreateBatches_ShorterPair_IsPaddedWithTheFamilysPaddingId(string name, long padding)
    {
        using var model = NliModel.Load(Directory(name));
        SentencePair[] pairs = [new("a", "b"), new("The ferry leaves at 07:45 every morning.", "The ferry leaves.")];
        var shortLength = model.Encode(pairs[0]).Length;

        var batches = model.CreateBatches(pairs, batchSize: 2);
        try
        {
            var batch = Assert.Single(batches);
            var ids = batch.Values[batch.InputNames.ToList().IndexOf("input_ids")].GetTensorDataAsSpan<long>();
            var shortRow = ids[..batch.SequenceLength].ToArray().SequenceEqual(model.Encode(pairs[0]).InputIds.Concat(Enumerable.Repeat(padding, batch.SequenceLength - shortLength)))
                ? ids[..batch.SequenceLength]
                : ids[batch.SequenceLength..];

            Assert.True(batch.SequenceLength > shortLength);
            Assert.All(shortRow[shortLength..].ToArray(), id => Assert.Equal(padding, id));
        }
        finally
        {
            foreach (var batch in batches)
            {
                batch.Dispose();
            }
        }
    }
}
