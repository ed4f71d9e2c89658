using System.Text.Json;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Nli.Tests;

/// <summary>
/// The calibration temperature in nli-model.json against reference/calibration.json, which the recipe writes
/// when it fits the temperature on its held-out pairs (models/recipe/calibrate.py) and which the model card
/// quotes. The sample is data/nli/mnli-matched-dev-500.csv (MultiNLI matched dev, seeded sample; SOURCES.md).
/// </summary>
[Collection(RepositoryModelCollection.Name)]
public sealed class CalibrationTests(ModelFixture fixture)
{
    private static readonly JsonElement Reference =
        JsonDocument.Parse(File.ReadAllText(RepositoryModel.File(Path.Combine("reference", "calibration.json")))).RootElement;

    [Fact]
    public void CardTemperature_IsTheFittedOne()
    {
        Assert.Equal(Reference.GetProperty("temperature").GetDouble(), fixture.Model.Card.Temperature, 9);
        Assert.NotEqual(1.0, fixture.Model.Card.Temperature);
    }

    /// <summary>
    /// The C# scorer's figure is the card's (recorded as scorer_sample_ece_after); the recipe's int8 emulation
    /// gets within 0.02 of it, the logits differing by a few hundredths (LogitParityTests) and so moving a few pairs
    /// across bin edges.
    /// </summary>
    [Fact]
    public async Task SampleCalibrationError_WithStoredTemperature_ReproducesTheCard()
    {
        var error = await CalibrationErrorAsync(fixture.Model);

        Assert.Equal(Reference.GetProperty("scorer_sample_ece_after").GetDouble(), error, 3);
        Assert.InRange(Math.Abs(error - Reference.GetProperty("sample_ece_after").GetDouble()), 0, 0.02);
    }

    /// <summary>The same model with the temperature taken out of its card: the uncalibrated figure of the card.</summary>
    [Fact]
    public async Task SampleCalibrationError_WithoutTemperature_IsTheCardsFigureBefore()
    {
        var card = System.Text.Json.Nodes.JsonNode.Parse(File.ReadAllText(RepositoryModel.File("nli-model.json")))!.AsObject();
        Assert.True(card.Remove("temperature"));
        using var plain = new TempModelDirectory().Link("vocab.txt").Link("model.onnx").Write("nli-model.json", card.ToJsonString());
        using var model = NliModel.Load(plain.Path);

        var error = await CalibrationErrorAsync(model);

        Assert.Equal(Reference.GetProperty("scorer_sample_ece_before").GetDouble(), error, 3);
    }

    private static async Task<double> CalibrationErrorAsync(NliModel model)
    {
        var set = LabelledPairReader.Read(Path.Combine(AppContext.BaseDirectory, "data", "nli", Reference.GetProperty("sample_file").GetString()!));
        Assert.Equal(Reference.GetProperty("sample_pairs").GetInt32(), set.Pairs.Count);
        using var scorer = new OnnxEntailmentScorer(model);
        return (await NliEvaluator.EvaluateAsync(scorer, set.Pairs)).CalibrationError;
    }
}
