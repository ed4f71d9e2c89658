using Plumbline.Cli.Composition;
using Plumbline.Cli.Tests.EndToEnd;
using Plumbline.LoopbackEndpoint;

namespace Plumbline.Cli.Tests.Composition;

/// <summary><c>plumb doctor</c> on the real parts: the shipped NLI model, CP-SAT, a SQLite cache in a temp folder, and model sources.</summary>
public sealed class DoctorTests
{
    private static readonly CompositionRoot Root = new() { Environment = _ => null };

    private static string Line(PlumbResult result, string check) =>
        result.Output.Split('\n').Single(l => l.Contains(" " + check + ": ", StringComparison.Ordinal));

    [Fact]
    public async Task Doctor_NoModelConfigured_ChecksTheRestAndSkipsTheModel()
    {
        using var folder = new TempDirectory();

        var result = await Plumb.RunInAsync(Root, folder.Path, "doctor", "--cache-dir", folder.File("cache"));

        Assert.True(result.ExitCode == 0, result.ToString());
        // The shipped model on these pairs: contradiction 0.98, entailment 0.83 (plumb nli); the instance's optimum is 3 by hand.
        Assert.Matches(@"^ok      NLI model: .*known contradiction pair read as contradiction \(p 0\.9\d\); known entailment pair read as entailment \(p 0\.[5-9]\d\)", Line(result, "NLI model"));
        Assert.StartsWith("ok      MAX-SAT solver: OR-Tools CP-SAT", Line(result, "MAX-SAT solver"), StringComparison.Ordinal);
        Assert.Contains("proved the optimum (cost 3)", Line(result, "MAX-SAT solver"), StringComparison.Ordinal);
        Assert.Equal($"ok      response cache: {folder.File("cache/responses.sqlite")} opened, 0 answers kept", Line(result, "response cache"));
        Assert.StartsWith("skipped model source: none configured", Line(result, "model source"), StringComparison.Ordinal);
        Assert.True(File.Exists(folder.File("cache/responses.sqlite")));
    }

    [Fact]
    public async Task Doctor_Endpoint_MakesExactlyOneCheapCallBesidesTheOpeningCheck()
    {
        using var folder = new TempDirectory();
        await using var server = await LoopbackModelServer.StartAsync();

        var result = await Plumb.RunInAsync(Root, folder.Path, "doctor", "--no-cache", "--model", server.BaseUrl.ToString(), "--model-name", "loopback-model");

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Matches(@"^ok      model source: .* answered one request \(p\(true\) \d\.\d\d for ""Water is wet\.""\)", Line(result, "model source"));
        // Opening an endpoint source is one one-token request; the doctor adds one answer request, nothing more.
        Assert.True(server.Requests == 2, string.Join(" | ", server.RequestsByPrompt.Select(p => $"{p.Key}: {p.Value}")));
        Assert.StartsWith("skipped response cache: turned off", Line(result, "response cache"), StringComparison.Ordinal);
    }

    [Fact]
    public async Task Doctor_LocalModel_ShowsMemory()
    {
        using var folder = new TempDirectory();
        var tiny = Path.Combine(SampleSweep.RepositoryRoot, "models", "tiny-decoder");

        var result = await Plumb.RunInAsync(Root, folder.Path, "doctor", "--no-cache", "--model", "onnx:" + tiny);

        Assert.True(result.ExitCode == 0, result.ToString());
        Assert.Matches(@"answered one request .*; resident memory \d+(\.\d)? (MiB|GiB)", Line(result, "model source"));
    }

    [Fact]
    public async Task Doctor_BrokenParts_EachSaysWhatToFixExitTwo()
    {
        using var folder = new TempDirectory();
        var notAModel = Directory.CreateDirectory(folder.File("empty-model")).FullName;
        var blocked = folder.Write("blocked", "a file where the cache folder should be");

        var result = await Plumb.RunInAsync(Root, folder.Path, "doctor", "--nli-model", notAModel, "--cache-dir", blocked,
            "--model", "recording:" + folder.File("absent.jsonl"));

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"FAIL    NLI model: {notAModel}", Line(result, "NLI model"), StringComparison.Ordinal);
        Assert.EndsWith("fix: --nli-model DIR (a folder with model.onnx, config.json and the tokenizer file) or nli.model in the config file", Line(result, "NLI model"), StringComparison.Ordinal);
        Assert.StartsWith("ok      MAX-SAT solver", Line(result, "MAX-SAT solver"), StringComparison.Ordinal);
        Assert.StartsWith("FAIL    response cache: ", Line(result, "response cache"), StringComparison.Ordinal);
        Assert.EndsWith("fix: --cache-dir DIR (a folder this user can write) or --no-cache", Line(result, "response cache"), StringComparison.Ordinal);
        Assert.StartsWith("FAIL    model source: ", Line(result, "model source"), StringComparison.Ordinal);
        Assert.Contains("absent.jsonl", Line(result, "model source"), StringComparison.Ordinal);
    }

    [Fact]
    public void KnownInstance_OptimumByBruteForce_IsThree()
    {
        // The doctor's instance, its optimum checked over all four assignments here (not by the solver under test).
        var costs = new[] { (false, false), (false, true), (true, false), (true, true) }
            .Select(a => SetUpChecks.KnownInstance.CostOf([a.Item1, a.Item2]))
            .ToList();

        Assert.Equal([null, 4L, 3L, 5L], costs);
    }
}
