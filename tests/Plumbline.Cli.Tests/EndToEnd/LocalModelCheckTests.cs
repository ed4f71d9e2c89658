using System.Text.Json;
using Plumbline.Cli.Tests.Doubles;
using Plumbline.Reports.Tests.Schema;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>
/// <c>plumb check</c> with a local model folder: the tiny random decoder in models/tiny-decoder runs the
/// whole pipeline (the verdict is meaningless with random weights; these tests check the pipeline), and a
/// folder that cannot be used stops the run before any claim is spent.
/// </summary>
public sealed class LocalModelCheckTests
{
    private static readonly string TinyModel = Path.Combine(SampleSweep.RepositoryRoot, "models", "tiny-decoder");

    [Fact]
    public async Task Check_TinyLocalModel_RunsEndToEndWithASchemaValidReport()
    {
        var result = await Plumb.RunAsync("check", "The lake is frozen in winter.", "--model", "onnx:" + TinyModel, "--format", "json", "--seed", "3", "--model-threads", "1", "--no-cache");

        Assert.True(result.ExitCode == 0, result.ToString());
        var validation = ReportSchemaFile.Evaluate(result.Output);
        Assert.True(validation.IsValid, ReportSchemaFile.Describe(validation));
        using var report = JsonDocument.Parse(result.Output);
        var settings = report.RootElement.GetProperty("settings");
        Assert.Equal("onnx:" + TinyModel, settings.GetProperty("model_source").GetString());
        Assert.Equal(3, settings.GetProperty("seed").GetInt32());
        var claim = report.RootElement.GetProperty("claims")[0];
        Assert.NotEqual("failed", claim.GetProperty("status").GetString());
        Assert.False(claim.GetProperty("probabilities_estimated").GetBoolean());

        // The root's two answer calls and at least one abduction per answer reached the model.
        Assert.True(claim.GetProperty("model_calls").GetInt32() >= 4);
        Assert.True(claim.GetProperty("tokens").GetProperty("completion").GetInt32() > 0);
    }

    [Fact]
    public async Task Check_TinyLocalModelSameSeed_GivesTheSameStatements()
    {
        static async Task<string[]> StatementsAsync()
        {
            var result = await Plumb.RunAsync("check", "The lake is frozen in winter.", "--model", "onnx:" + TinyModel, "--format", "json", "--seed", "8", "--no-cache");
            Assert.True(result.ExitCode == 0, result.ToString());
            using var report = JsonDocument.Parse(result.Output);
            return report.RootElement.GetProperty("claims")[0].GetProperty("statements").EnumerateArray()
                .Select(s => s.GetProperty("text").GetString()!).ToArray();
        }

        Assert.Equal(await StatementsAsync(), await StatementsAsync());
    }

    [Fact]
    public async Task Check_FolderWithoutModel_ExitsTwoNamingTheFolderBeforeAnyClaim()
    {
        using var folder = new TempDirectory();

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "onnx:" + folder.Path);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"plumb: --model: '{folder.Path}': no model: no genai_config.json and no .onnx file", Assert.Single(result.ErrorLines));
        Assert.Empty(result.Output);
    }

    [Fact]
    public async Task Check_EncoderFolder_ExitsTwoSayingItIsNotDecoderOnly()
    {
        var nli = Path.Combine(SampleSweep.RepositoryRoot, "models", "nli-minilm-int8");

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "onnx:" + nli);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"plumb: --model: '{nli}': not a decoder-only model:", Assert.Single(result.ErrorLines), StringComparison.Ordinal);
        Assert.Empty(result.Output);
    }

    [Fact]
    public async Task Check_MissingTokenizer_ExitsTwoSayingWhichFile()
    {
        using var folder = new TempDirectory();
        foreach (var file in Directory.EnumerateFiles(TinyModel).Where(f => Path.GetFileName(f) != "tokenizer.json"))
        {
            File.Copy(file, folder.File(Path.GetFileName(file)));
        }

        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "onnx:" + folder.Path);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"plumb: --model: '{folder.Path}': tokenizer missing: no tokenizer.json (or tokenizer.model)", Assert.Single(result.ErrorLines));
    }

    [Theory]
    [InlineData("onnx:", "plumb: --model: 'onnx:' needs the model folder's path")]
    public async Task Check_OnnxWithoutFolder_ExitsTwo(string source, string expected)
    {
        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", source);

        Assert.Equal(2, result.ExitCode);
        Assert.Equal(expected, Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Check_ModelThreadsWithARecording_ExitsTwo()
    {
        var result = await Plumb.RunAsync("check", TestClaims.Bats, "--model", "recording:x.jsonl", "--model-threads", "2");

        Assert.Equal(2, result.ExitCode);
        Assert.Equal("plumb: --model-threads: only a local model (--model onnx:DIR) runs here", Assert.Single(result.ErrorLines));
    }
}
