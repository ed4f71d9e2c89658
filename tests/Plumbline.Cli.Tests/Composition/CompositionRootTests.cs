using System.Text.Json;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Tests.Doubles;
using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;

namespace Plumbline.Cli.Tests.Composition;

/// <summary>The composition root takes doubles in place of the real model and NLI model, so commands can be tested without loading either.</summary>
public sealed class CompositionRootTests
{
    private static CompositionRoot WithDoubles(ILanguageModel model) => new()
    {
        OpenModel = (_, _, _) => Task.FromResult(OpenedModel.Stored(model, new ModelIdentity("scripted", "scripted"))),
        OpenScorer = _ => new NeutralScorer(),
    };

    [Fact]
    public async Task Check_WithScriptedModelAndNeutralScorer_JudgesWithoutTheRealModels()
    {
        var model = new ScriptedLanguageModel(new Dictionary<string, double> { [TestClaims.Bats] = 0.9 });

        var result = await Plumb.RunAsync(WithDoubles(model), "check", TestClaims.Bats, "--model", "recording:not-read.jsonl", "--nli-model", "/not/read", "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal("neutral", report.RootElement.GetProperty("settings").GetProperty("nli_model").GetString());
        Assert.Equal("scripted", report.RootElement.GetProperty("settings").GetProperty("model_source").GetString());
        // Every explanation the scripted model writes for True is believed (0.8), so with no links the claim stays true.
        Assert.True(ReportJson.Claim(report, "c1").GetProperty("answer").GetBoolean());
    }

    [Fact]
    public async Task Sweep_StandardInput_ReadsClaimsFromIt()
    {
        var model = new ScriptedLanguageModel(new Dictionary<string, double> { [TestClaims.Bats] = 0.9, [TestClaims.Sun] = 0.2 });
        var stdin = $"id,claim,gold\nbats,{TestClaims.Bats},yes\nsun,{TestClaims.Sun},no\n";

        var result = await Plumb.RunWithInputAsync(WithDoubles(model), stdin, "sweep", "-", "--model", "recording:x", "--format", "json");

        Assert.True(result.ExitCode == 0, result.ToString());
        using var report = JsonDocument.Parse(result.Output);
        Assert.Equal(["bats", "sun"], ReportJson.Ids(report));
        Assert.False(ReportJson.Claim(report, "sun").GetProperty("gold").GetBoolean());
    }
}
