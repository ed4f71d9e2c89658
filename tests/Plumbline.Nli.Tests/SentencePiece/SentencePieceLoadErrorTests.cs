using System.Text.Json.Nodes;
using static Plumbline.Nli.Tests.SentencePiece.SentencePieceModelEditor;
using static Plumbline.Nli.Tests.SentencePiece.TinySentencePieceModels;

namespace Plumbline.Nli.Tests.SentencePiece;

/// <summary>Broken SentencePiece folders fail at load with one NliModelException whose one-line message names the file.</summary>
public sealed class SentencePieceLoadErrorTests
{
    [Fact]
    public void Load_SpmModelWithoutFramePieces_NamesTheModelFile()
    {
        using var directory = Copy(DebertaV3);
        EditModel(directory, "spm.model", model => EditPieces(model, (_, text, type) => (text == "[CLS]" ? "[BOS]" : text, type)));

        var error = AssertLoadFails(directory, "spm.model");

        Assert.Contains("[CLS]", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_SpmModelWithoutUnknownPiece_NamesTheModelFile()
    {
        using var directory = Copy(DebertaV3);
        EditModel(directory, "spm.model", model => EditPieces(model, (_, text, type) => (text, type == UnknownType ? NormalType : type)));

        var error = AssertLoadFails(directory, "spm.model");

        Assert.Contains("unknown piece", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_SpmModelOfCharacterType_NamesTheModelFileAndTheType()
    {
        using var directory = Copy(DebertaV3);
        EditModel(directory, "spm.model", model => WithTrainerField(model, ModelTypeField, CharModelType));

        var error = AssertLoadFails(directory, "spm.model");

        Assert.Contains("Char", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_SpmModelWithByteFallback_NamesTheModelFile()
    {
        using var directory = Copy(DebertaV3Bpe);
        EditModel(directory, "spm.model", model => WithTrainerField(model, ByteFallbackField, 1));

        var error = AssertLoadFails(directory, "spm.model");

        Assert.Contains("byte fallback", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_SpmModelThatIsNotAModel_NamesTheModelFile()
    {
        using var directory = Copy(DebertaV3);
        directory.Write("spm.model", "this is a text file, not a SentencePiece model\n");

        var error = AssertLoadFails(directory, "spm.model");

        Assert.Contains("not a SentencePiece model", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_ModelWithStartAndEndButNeitherPaddingNorFairseqLayout_NamesTheModelFile()
    {
        // <unk> moved away from id 0: no longer the layout a fairseq dictionary shifts by one.
        using var directory = Copy(XlmRoberta);
        EditModel(directory, "sentencepiece.bpe.model", model => EditPieces(model, (id, text, type) => (text, id switch
        {
            0 => NormalType,
            5 => UnknownType,
            _ => type,
        })));

        var error = AssertLoadFails(directory, "sentencepiece.bpe.model");

        Assert.Contains("<pad>", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_CardNamingAMissingSpmModel_NamesThatFile()
    {
        using var directory = Copy(DebertaV3Bpe);
        System.IO.File.Delete(directory.File("spm.model"));

        AssertLoadFails(directory, "spm.model");
    }

    [Fact]
    public void Load_FolderWithOnlyTokenizerJson_NamesTokenizerJsonAndTheFilesNeeded()
    {
        using var directory = Copy(DebertaV3);
        System.IO.File.Delete(directory.File("spm.model"));
        directory.Write("tokenizer.json", """{ "model": { "type": "Unigram" } }""");

        var error = AssertLoadFails(directory, "tokenizer.json");

        Assert.Contains("spm.model", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_ConfigVocabSizeBelowTheTokenizersIds_NamesTheModelFileAndBothSizes()
    {
        using var directory = Copy(DebertaV3);
        EditConfig(directory, config => config["vocab_size"] = 100);

        var error = AssertLoadFails(directory, "spm.model");

        Assert.Contains("vocab_size is 100", error.Message, StringComparison.Ordinal);
        Assert.Contains("up to 499", error.Message, StringComparison.Ordinal);  // 500 pieces, ids 0..499
    }

    [Fact]
    public void Load_XlmRobertaConfigVocabSizeWithoutRoomForTheOffset_NamesTheModelFile()
    {
        // 500 pieces shifted up by one need 501 rows.
        using var directory = Copy(XlmRoberta);
        EditConfig(directory, config => config["vocab_size"] = 500);

        var error = AssertLoadFails(directory, "sentencepiece.bpe.model");

        Assert.Contains("up to 500", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_XlmRobertaTokenizerInADebertaFolder_NamesTheTokenizerAndBothPaddingIds()
    {
        // Ids fit within vocab_size here, but the fairseq <pad>=1 cannot be the [PAD]=0 the model was trained with.
        using var directory = Copy(DebertaV3);
        System.IO.File.Delete(directory.File("spm.model"));
        System.IO.File.Copy(File(XlmRoberta, "sentencepiece.bpe.model"), directory.File("sentencepiece.bpe.model"));

        var error = AssertLoadFails(directory, "sentencepiece.bpe.model");

        Assert.Contains("pads with id 1", error.Message, StringComparison.Ordinal);
        Assert.Contains("pad_token_id is 0", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_GraphTakingTokenTypeIdsWithOneSegmentRow_NamesModelOnnx()
    {
        using var directory = Copy(DebertaV3Bpe);
        EditConfig(directory, config => config["type_vocab_size"] = 1);

        var error = AssertLoadFails(directory, "model.onnx");

        Assert.Contains("token_type_ids", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_GraphWithoutTokenTypeIds_IgnoresTypeVocabSize()
    {
        // deberta-v3's graph has no token_type_ids input, so a one-row segment table cannot be misused.
        using var directory = Copy(DebertaV3);
        EditConfig(directory, config => config["type_vocab_size"] = 1);

        using var model = NliModel.Load(directory.Path);

        Assert.Equal(1, model.Card.TypeVocabularySize);
    }

    [Fact]
    public void Load_GenericLabelNames_NamesConfigAndAsksForOurCard()
    {
        using var directory = Copy(DebertaV3);
        EditConfig(directory, config =>
        {
            config["id2label"] = new JsonObject { ["0"] = "LABEL_0", ["1"] = "LABEL_1", ["2"] = "LABEL_2" };
            config.Remove("label2id");
        });

        var error = AssertLoadFails(directory, "config.json");

        Assert.Contains("nli-model.json", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_ConfigWithLabel2IdOnly_ReadsTheOrderFromIt()
    {
        using var directory = Copy(DebertaV3);
        EditConfig(directory, config =>
        {
            config.Remove("id2label");
            config["label2id"] = new JsonObject { ["entailment"] = 2, ["neutral"] = 0, ["contradiction"] = 1 };
        });

        using var model = NliModel.Load(directory.Path);

        Assert.Equal(["neutral", "contradiction", "entailment"], model.Card.Labels);
    }

    [Fact]
    public void Load_TokenizerConfigSplittingPunctuation_NamesTokenizerConfig()
    {
        using var directory = Copy(DebertaV3);
        directory.Write("tokenizer_config.json", """{ "do_lower_case": false, "split_by_punct": true }""");

        var error = AssertLoadFails(directory, "tokenizer_config.json");

        Assert.Contains("split_by_punct", error.Message, StringComparison.Ordinal);
    }

    private static TempModelDirectory Copy(string name) => new TempModelDirectory().CopyFrom(Directory(name));

    private static void EditModel(TempModelDirectory directory, string file, Func<byte[], byte[]> edit) =>
        directory.Write(file, edit(System.IO.File.ReadAllBytes(directory.File(file))));

    private static void EditConfig(TempModelDirectory directory, Action<JsonObject> edit)
    {
        var config = JsonNode.Parse(System.IO.File.ReadAllText(directory.File("config.json")))!.AsObject();
        edit(config);
        directory.Write("config.json", config.ToJsonString());
    }

    private static NliModelException AssertLoadFails(TempModelDirectory directory, string file)
    {
        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));
        Assert.Equal(directory.File(file), error.FilePath);
        Assert.DoesNotContain('\n', error.Message);
        return error;
    }
}
