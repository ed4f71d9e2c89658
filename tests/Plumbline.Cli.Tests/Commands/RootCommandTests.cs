namespace Plumbline.Cli.Tests.Commands;

public sealed class RootCommandTests
{
    [Fact]
    public async Task Run_NoArguments_ShowsHelpAndExitsTwo()
    {
        var result = await Plumb.RunAsync();

        Assert.Equal(2, result.ExitCode);
        foreach (var command in new[] { "check", "sweep", "solve", "nli" })
        {
            Assert.Contains(command, result.Output);
        }
    }

    [Fact]
    public async Task Run_UnknownCommand_ExitsTwoWithOneLine()
    {
        var result = await Plumb.RunAsync("judge", "x");

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("plumb: ", Assert.Single(result.ErrorLines));
    }

    [Fact]
    public async Task Run_Help_ExitsZeroAndListsTheSharedOptions()
    {
        var result = await Plumb.RunAsync("check", "--help");

        Assert.Equal(0, result.ExitCode);
        foreach (var option in new[]
        {
            "--model", "--nli-model", "--negation", "--weighting", "--contested-at", "--export-wcnf", "--format", "--output",
            "--integrity-gap", "--belief-form", "--link-floor", "--conflicts", "--contradictions", "--nli-text", "--cut-off",
            "--integral-claim", "--claim-belief", "--direct-answer", "--samples",
        })
        {
            Assert.Contains(option, result.Output);
        }
    }
}
