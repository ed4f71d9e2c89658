namespace Plumbline.Nli.Tests;

/// <summary>Unusable model directories fail with one NliModelException whose one-line message names the file.</summary>
public sealed class ModelLoadErrorTests
{
    [Fact]
    public void Load_MissingVocabulary_NamesVocabularyFile()
    {
        using var directory = new TempModelDirectory().Link("model.onnx").Link("nli-model.json");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("vocab.txt"));
    }

    [Fact]
    public void Load_MissingModel_NamesModelFile()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("nli-model.json");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("model.onnx"));
    }

    [Fact]
    public void Load_GarbageModelBytes_NamesModelFile()
    {
        var garbage = new byte[4096];
        new Random(7).NextBytes(garbage);
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("nli-model.json").Write("model.onnx", garbage);

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("model.onnx"));
        Assert.Contains("ONNX", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_CardWithTwoLabelsForThreeOutputs_NamesCardAndBothCounts()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("nli-model.json", """{ "name": "two", "labels": ["entailment", "contradiction"] }""");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("nli-model.json"));
        Assert.Contains("2 labels", error.Message, StringComparison.Ordinal);
        Assert.Contains("3 classes", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_CardWithUnknownLabelName_NamesCard()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("nli-model.json", """{ "labels": ["entailment", "neutral", "other"] }""");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("nli-model.json"));
        Assert.Contains("other", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_CardNotJson_NamesCardAndLine()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("nli-model.json", "{\n  \"labels\": [\"entailment\",\n  oops\n}");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("nli-model.json"));
        Assert.Contains("line 3", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_CardFieldOfWrongType_NamesField()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("nli-model.json", """{ "labels": ["entailment", "neutral", "contradiction"], "max_length": "long" }""");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("nli-model.json"));
        Assert.Contains("'max_length'", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_DirectoryWithoutDescription_NamesDirectory()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.Path);
        Assert.Contains("nli-model.json", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_ConfigWithGapInLabelIndices_NamesConfigAndField()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("config.json", """{ "id2label": { "0": "entailment", "2": "neutral", "3": "contradiction" } }""");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("config.json"));
        Assert.Contains("'id2label'", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Load_CardWithNegativeTemperature_NamesCard()
    {
        using var directory = new TempModelDirectory().Link("vocab.txt").Link("model.onnx")
            .Write("nli-model.json", """{ "labels": ["entailment", "neutral", "contradiction"], "temperature": -1.5 }""");

        var error = Assert.Throws<NliModelException>(() => NliModel.Load(directory.Path));

        AssertNames(error, directory.File("nli-model.json"));
        Assert.Contains("temperature", error.Message, StringComparison.Ordinal);
    }

    private static void AssertNames(NliModelException error, string file)
    {
        Assert.Equal(file, error.FilePath);
        Assert.StartsWith(file, error.Message, StringComparison.Ordinal);
        Assert.DoesNotContain('\n', error.Message);
    }
}
