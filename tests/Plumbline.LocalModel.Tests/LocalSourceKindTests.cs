using Plumbline.Core.Language.Sources;

namespace Plumbline.LocalModel.Tests;

public sealed class LocalSourceKindTests
{
    private static readonly ModelOpening Opening = new("1");

    [Theory]
    [InlineData("onnx:models/tiny-decoder", true)]
    [InlineData("ONNX:/x", true)]
    [InlineData("recording:x.jsonl", false)]
    [InlineData("http://127.0.0.1:8080/v1", false)]
    [InlineData("models/tiny-decoder", false)]
    public void Recognises_OnlyTheOnnxSpelling(string source, bool expected) =>
        Assert.Equal(expected, new LocalSourceKind(LocalModelOptions.Default).Recognises(source));

    [Fact]
    public async Task OpenAsync_ThroughTheRegistry_OpensTheFolderOnce()
    {
        var registry = new ModelSourceRegistry([new LocalSourceKind(new LocalModelOptions(Seed: 4))]);

        var opened = await registry.OpenAsync("onnx:" + TinyModel.Directory, Opening, CancellationToken.None);
        await using var model = opened.Model;

        Assert.Equal("onnx:" + TinyModel.Directory, model.Describe);
        Assert.True(opened.Cacheable);
        Assert.Empty(opened.Notices);
        Assert.Equal("onnx", opened.Identity.Kind);
        Assert.Equal(Path.GetFullPath(TinyModel.Directory), opened.Identity.Name);
        Assert.Contains(new KeyValuePair<string, string>("seed", "4"), opened.Identity.Parameters);
    }

    [Fact]
    public async Task OpenAsync_FolderWithChatTemplate_SaysSoInANotice()
    {
        using var folder = TempDirectory.WithTinyModel();
        File.WriteAllText(folder.File("chat_template.jinja"), "{% for m in messages %}{{ m['content'] }}{% endfor %}");

        var opened = await new LocalSourceKind(LocalModelOptions.Default).OpenAsync("onnx:" + folder.Path, Opening, CancellationToken.None);
        await using var model = opened.Model;

        Assert.Equal($"onnx:{folder.Path}: prompts are wrapped in the folder's chat template as one user message", Assert.Single(opened.Notices));
    }

    [Fact]
    public async Task OpenAsync_UnusableFolder_IsAModelSourceErrorNamingIt()
    {
        using var folder = new TempDirectory();

        var error = await Assert.ThrowsAsync<ModelSourceException>(() =>
            new LocalSourceKind(LocalModelOptions.Default).OpenAsync("onnx:" + folder.Path, Opening, CancellationToken.None));

        Assert.Equal($"--model: '{folder.Path}': no model: no genai_config.json and no .onnx file", error.Message);
    }

    [Fact]
    public async Task OpenAsync_NoFolder_SaysWhatIsNeeded()
    {
        var error = await Assert.ThrowsAsync<ModelSourceException>(() =>
            new LocalSourceKind(LocalModelOptions.Default).OpenAsync("onnx:", Opening, CancellationToken.None));

        Assert.Equal("--model: 'onnx:' needs the model folder's path", error.Message);
    }

    [Fact]
    public void Identify_ChangesWithTheFolderFilesAndTheSeed()
    {
        using var folder = TempDirectory.WithTinyModel();
        var kind = new LocalSourceKind(new LocalModelOptions(Seed: 1));
        var source = "onnx:" + folder.Path;
        var first = kind.Identify(source);

        Assert.Equal(first, kind.Identify(source));
        Assert.NotEqual(first, new LocalSourceKind(new LocalModelOptions(Seed: 2)).Identify(source));
        File.AppendAllText(folder.File("tokenizer_config.json"), " ");
        Assert.NotEqual(first, kind.Identify(source));
    }
}
