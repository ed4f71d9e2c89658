using Plumbline.Cli.Input;
using Plumbline.Core.Claims;

namespace Plumbline.Cli.Tests.Input;

public sealed class ClaimFileReaderTests
{
    private static async Task<List<Claim>> ReadAsync(string text, bool plainText = false, string source = "claims.jsonl")
    {
        var claims = new List<Claim>();
        await foreach (var claim in ClaimFileReader.ReadAsync(new StringReader(text), source, plainText, CancellationToken.None))
        {
            claims.Add(claim);
        }

        return claims;
    }

    private static async Task<ClaimFileException> FailAsync(string text, bool plainText = false) =>
        await Assert.ThrowsAsync<ClaimFileException>(() => ReadAsync(text, plainText));

    [Fact]
    public async Task ReadAsync_JsonLines_YieldsIdTextGoldAndTags()
    {
        var claims = await ReadAsync(
            "{\"id\": \"bats\", \"claim\": \"Bats are mammals.\", \"gold\": true, \"tags\": [\"biology\", \"easy\"]}\n" +
            "\n" +
            "{\"id\": \"sun\", \"claim\": \"  The sun orbits the earth. \", \"gold\": false}\n" +
            "{\"claim\": \"Water boils at 100 C at sea level.\", \"gold\": null}\n");

        Assert.Equal(3, claims.Count);
        Assert.Equal(new Claim("bats", "Bats are mammals.", true, ["biology", "easy"]).Id, claims[0].Id);
        Assert.Equal("Bats are mammals.", claims[0].Text);
        Assert.True(claims[0].Gold);
        Assert.Equal(["biology", "easy"], claims[0].Tags);
        Assert.Equal("sun", claims[1].Id);
        Assert.Equal("The sun orbits the earth.", claims[1].Text);
        Assert.False(claims[1].Gold);
        Assert.Empty(claims[1].Tags);
        // No id: the line number stands in for it.
        Assert.Equal("4", claims[2].Id);
        Assert.Null(claims[2].Gold);
    }

    [Fact]
    public async Task ReadAsync_PlainText_OneClaimPerLineWithLineNumberIds()
    {
        var claims = await ReadAsync("Bats are mammals.\n\n  Ice sinks in water.  \r\nCopper conducts electricity.", plainText: true);

        Assert.Equal(["1", "3", "4"], claims.Select(c => c.Id));
        Assert.Equal(["Bats are mammals.", "Ice sinks in water.", "Copper conducts electricity."], claims.Select(c => c.Text));
        Assert.All(claims, c => Assert.Null(c.Gold));
    }

    [Theory]
    [InlineData("{\"id\": \"a\"}", "claims.jsonl:1: claim: missing or empty")]
    [InlineData("{\"id\": \"a\", \"claim\": \"   \"}", "claims.jsonl:1: claim: missing or empty")]
    [InlineData("{\"id\": \"a\", \"claim\": 3}", "claims.jsonl:1: claim: missing or empty")]
    [InlineData("{\"id\": \"a\", \"claim\": \"x\", \"gold\": \"yes\"}", "claims.jsonl:1: gold: expected true, false or null, found a string")]
    [InlineData("{\"id\": \"a\", \"claim\": \"x\", \"gold\": 1}", "claims.jsonl:1: gold: expected true, false or null, found a number")]
    [InlineData("{\"id\": 7, \"claim\": \"x\"}", "claims.jsonl:1: id: expected a string, found a number")]
    [InlineData("{\"id\": \"\", \"claim\": \"x\"}", "claims.jsonl:1: id: empty")]
    [InlineData("{\"claim\": \"x\", \"tags\": \"a\"}", "claims.jsonl:1: tags: expected an array of strings, found a string")]
    [InlineData("{\"claim\": \"x\", \"tags\": [\"a\", 2]}", "claims.jsonl:1: tags[1]: expected a string, found a number")]
    [InlineData("{\"claim\": \"x\", \"glod\": true}", "claims.jsonl:1: glod: unknown field (known: id, claim, gold, tags)")]
    [InlineData("{\"claim\": \"x\", \"claim\": \"y\"}", "claims.jsonl:1: claim: given twice")]
    [InlineData("[\"x\"]", "claims.jsonl:1: expected a JSON object, found an array")]
    [InlineData("{\"claim\": \"x\"", "claims.jsonl:1: invalid JSON at byte 14 of the line")]
    public async Task ReadAsync_BadLine_OneLineErrorNamesFileLineAndField(string line, string expected)
    {
        var error = await FailAsync(line);

        Assert.Equal(expected, error.Message);
        Assert.Equal(1, error.Line);
        Assert.DoesNotContain('\n', error.Message);
    }

    [Fact]
    public async Task ReadAsync_MissingClaimOnLaterLine_NamesThatLine()
    {
        var error = await FailAsync("{\"id\": \"a\", \"claim\": \"x\"}\n\n{\"id\": \"b\", \"claim\": \"y\"}\n{\"id\": \"c\"}\n");

        Assert.Equal("claims.jsonl:4: claim: missing or empty", error.Message);
        Assert.Equal(("claims.jsonl", 4, "claim"), (error.File, error.Line, error.Field));
    }

    [Fact]
    public async Task ReadAsync_DuplicateId_NamesBothLines()
    {
        var error = await FailAsync("{\"id\": \"a\", \"claim\": \"x\"}\n{\"id\": \"b\", \"claim\": \"y\"}\n{\"id\": \"a\", \"claim\": \"z\"}\n");

        Assert.Equal("claims.jsonl:3: id: duplicate id 'a' (first used on line 1)", error.Message);
    }

    [Fact]
    public async Task ReadAsync_ExplicitIdEqualToAnotherLinesNumber_IsADuplicate()
    {
        var error = await FailAsync("{\"id\": \"2\", \"claim\": \"x\"}\n{\"claim\": \"y\"}\n");

        Assert.Equal("claims.jsonl:2: id: duplicate id '2' (first used on line 1)", error.Message);
    }

    [Theory]
    [InlineData("", false)]
    [InlineData("\n   \n", false)]
    [InlineData("\n\n", true)]
    public async Task ReadAsync_NoClaim_IsAnError(string text, bool plainText)
    {
        var error = await FailAsync(text, plainText);

        Assert.Contains("the file holds no claim", error.Message);
        Assert.StartsWith("claims.jsonl:", error.Message);
    }

    [Fact]
    public async Task ReadAsync_BadLineAfterGoodOnes_YieldsTheGoodOnesFirst()
    {
        // Claims are judged as they are read, so a bad line must not stop the ones before it.
        var yielded = new List<string>();
        var text = "{\"id\": \"a\", \"claim\": \"x\"}\n{\"id\": \"b\", \"claim\": \"y\"}\n{\"id\": \"c\", \"gold\": 3}\n";

        var error = await Assert.ThrowsAsync<ClaimFileException>(async () =>
        {
            await foreach (var claim in ClaimFileReader.ReadAsync(new StringReader(text), "claims.jsonl", false, CancellationToken.None))
            {
                yielded.Add(claim.Id);
            }
        });

        Assert.Equal(["a", "b"], yielded);
        Assert.Equal(3, error.Line);
    }

    [Fact]
    public async Task ReadFileAsync_TxtExtension_ReadsPlainLinesAndOtherExtensionsReadJson()
    {
        using var folder = new TempDirectory();
        var txt = folder.Write("claims.txt", "{\"claim\": \"braces are text here\"}\nSecond claim\n");
        var jsonl = folder.Write("claims.jsonl", "{\"id\": \"q\", \"claim\": \"From JSON\"}\n");

        var fromTxt = new List<Claim>();
        await foreach (var claim in ClaimFileReader.ReadFileAsync(txt, CancellationToken.None))
        {
            fromTxt.Add(claim);
        }

        var fromJson = new List<Claim>();
        await foreach (var claim in ClaimFileReader.ReadFileAsync(jsonl, CancellationToken.None))
        {
            fromJson.Add(claim);
        }

        Assert.Equal(["{\"claim\": \"braces are text here\"}", "Second claim"], fromTxt.Select(c => c.Text));
        Assert.Equal(["q"], fromJson.Select(c => c.Id));
        Assert.Equal(["From JSON"], fromJson.Select(c => c.Text));
    }

    [Fact]
    public async Task ReadFileAsync_ErrorNamesThePathAsGiven()
    {
        using var folder = new TempDirectory();
        var path = folder.Write("bad.jsonl", "{\"id\": \"a\", \"claim\": \"x\"}\n{\"id\": \"b\", \"claim\": \"\"}\n");

        var error = await Assert.ThrowsAsync<ClaimFileException>(async () =>
        {
            await foreach (var _ in ClaimFileReader.ReadFileAsync(path, CancellationToken.None))
            {
            }
        });

        Assert.Equal($"{path}:2: claim: missing or empty", error.Message);
    }
}
