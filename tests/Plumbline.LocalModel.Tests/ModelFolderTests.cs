using System.Text.Json.Nodes;

namespace Plumbline.LocalModel.Tests;

/// <summary>
/// Folders that cannot be used are refused when opened, with one line naming the folder and what is missing,
/// before anything is loaded.
/// </summary>
public sealed class ModelFolderTests
{
    private static LocalModelException Refused(string directory, long? availableMemory = null)
    {
        var error = Assert.Throws<LocalModelException>(() => LocalLanguageModel.Open(directory, new LocalModelOptions(AvailableMemory: availableMemory)));
        Assert.StartsWith($"'{directory}': ", error.Message, StringComparison.Ordinal);
        Assert.DoesNotContain('\n', error.Message);
        return error;
    }

    private static void EditConfig(TempDirectory folder, Action<JsonObject> edit)
    {
        var config = JsonNode.Parse(File.ReadAllText(folder.File("genai_config.json")))!.AsObject();
        edit(config);
        File.WriteAllText(folder.File("genai_config.json"), config.ToJsonString());
    }

    [Fact]
    public void Open_MissingFolder_SaysSo()
    {
        var error = Refused(Path.Combine(Path.GetTempPath(), "no-such-model-folder-" + Guid.NewGuid().ToString("N")));

        Assert.Equal("folder not found", error.Problem);
    }

    [Fact]
    public void Open_EmptyFolder_SaysThereIsNoModel()
    {
        using var folder = new TempDirectory();

        Assert.Equal("no model: no genai_config.json and no .onnx file", Refused(folder.Path).Problem);
    }

    [Fact]
    public void Open_EncoderFolder_SaysItIsNotDecoderOnly()
    {
        // The shipped NLI cross-encoder: inputs input_ids, attention_mask, token_type_ids (models/README.md).
        var error = Refused(TinyModel.NliDirectory);

        Assert.Equal("not a decoder-only model: 'model.onnx' takes no past key/values (inputs: input_ids, attention_mask, token_type_ids)", error.Problem);
    }

    [Fact]
    public void Open_ConfigNamingAnEncoderGraph_SaysItHasNoCache()
    {
        using var folder = TempDirectory.WithTinyModel();
        File.Copy(Path.Combine(TinyModel.NliDirectory, "model.onnx"), folder.File("model.onnx"), overwrite: true);

        Assert.Equal("not a decoder-only model with a key/value cache: 'model.onnx' has no input 'past_key_values.0.key'", Refused(folder.Path).Problem);
    }

    [Fact]
    public void Open_EncoderDecoderConfig_SaysItIsNotDecoderOnly()
    {
        using var folder = TempDirectory.WithTinyModel();
        EditConfig(folder, config =>
        {
            config["model"]!["type"] = "whisper";
            config["model"]!["encoder"] = new JsonObject { ["filename"] = "encoder.onnx" };
        });

        Assert.Equal("not a decoder-only model: genai_config.json describes a model of type 'whisper' with an encoder", Refused(folder.Path).Problem);
    }

    [Fact]
    public void Open_DecoderWithoutConfig_SaysTheConfigIsMissing()
    {
        using var folder = TempDirectory.WithTinyModel();
        File.Delete(folder.File("genai_config.json"));

        Assert.Equal("no genai_config.json beside the decoder 'model.onnx': the runtime needs it to run the model", Refused(folder.Path).Problem);
    }

    [Fact]
    public void Open_ConfigWithoutItsModelFile_SaysTheModelIsMissing()
    {
        using var folder = TempDirectory.WithTinyModel();
        File.Delete(folder.File("model.onnx"));

        Assert.Equal("no model: genai_config.json names 'model.onnx', which is not there", Refused(folder.Path).Problem);
    }

    [Fact]
    public void Open_ModelFileThatIsNotOnnx_SaysSo()
    {
        using var folder = TempDirectory.WithTinyModel();
        File.WriteAllText(folder.File("model.onnx"), "version https://git-lfs.github.com/spec/v1\noid sha256:0\nsize 1\n");

        Assert.StartsWith("'model.onnx' is not an ONNX model", Refused(folder.Path).Problem, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("tokenizer.json", "tokenizer missing: no tokenizer.json (or tokenizer.model)")]
    [InlineData("tokenizer_config.json", "tokenizer missing: no tokenizer_config.json")]
    public void Open_MissingTokenizerFile_SaysWhichOne(string file, string problem)
    {
        using var folder = TempDirectory.WithTinyModel();
        File.Delete(folder.File(file));

        Assert.Equal(problem, Refused(folder.Path).Problem);
    }

    [Fact]
    public void Open_LessMemoryThanTheWeights_SaysItIsTooLarge()
    {
        // The tiny model's weights: model.onnx, 696,175 bytes = 0.66 MiB; 100 KiB = 0.098 MiB cannot hold them.
        var error = Refused(TinyModel.Directory, availableMemory: 100 * 1024);

        Assert.Equal("too large for memory: the model's weights take 0.7 MiB, only 0.1 MiB is available", error.Problem);
    }

    [Fact]
    public void Open_WeightsLargerThanThisMachine_SaysItIsTooLarge()
    {
        // A sparse one-tebibyte external weight file: no disk used, but no machine of ours has the memory.
        using var folder = TempDirectory.WithTinyModel();
        using (var data = File.Create(folder.File("model.onnx.data")))
        {
            data.SetLength(1L << 40);
        }

        Assert.StartsWith("too large for memory: the model's weights take 1024.0 GiB, only ", Refused(folder.Path).Problem, StringComparison.Ordinal);
    }

    [Fact]
    public void Open_VocabularyDisagreeingWithTheGraph_IsRefusedBeforeAnyRequest()
    {
        using var folder = TempDirectory.WithTinyModel();
        EditConfig(folder, config => config["model"]!["vocab_size"] = 500);

        var problem = Refused(folder.Path).Problem;

        Assert.StartsWith("the runtime cannot run this model: ", problem, StringComparison.Ordinal);
        Assert.Contains("index: 2 Got: 500 Expected: 479", problem, StringComparison.Ordinal);
    }
}
