using System.Text;
using Plumbline.Application.Input;
using Plumbline.Core.Claims;

namespace Plumbline.Application.Tests.Input;

public sealed class ClaimInputTests
{
    private static async Task<(List<Claim> Claims, ClaimInput Input)> OpenAsync(TempDirectory folder, string name, string text, ClaimFileFormat format = ClaimFileFormat.Auto)
    {
        var input = await ClaimInput.OpenFileAsync(folder.Write(name, text), format, CancellationToken.None);
        var claims = new List<Claim>();
        await foreach (var claim in input.ReadAsync(CancellationToken.None))
        {
            claims.Add(claim);
        }

        return (claims, input);
    }

    /// <summary>The one problem of a file holding <paramref name="line"/> and a good line, its path shortened to the file name.</summary>
    private static async Task<string> ProblemAsync(string line, string name = "claims.jsonl")
    {
        using var folder = new TempDirectory();
        var (claims, input) = await OpenAsync(folder, name, line + "\n{\"id\": \"ok\", \"claim\": \"fine\"}\n");
        Assert.Equal(["ok"], claims.Select(c => c.Id));
        return Assert.Single(input.Problems).Message.Replace(folder.File(name), name, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Open_JsonLines_YieldsIdTextGoldAndTags()
    {
        using var folder = new TempDirectory();
        var (claims, input) = await OpenAsync(folder, "claims.jsonl",
            "{\"id\": \"bats\", \"claim\": \"Bats are mammals.\", \"gold\": true, \"tags\": [\"biology\", \"easy\"]}\n" +
            "\n" +
            "{\"id\": \"sun\", \"claim\": \"  The sun orbits the earth. \", \"gold\": false}\n" +
            "{\"claim\": \"Water boils at 100 C at sea level.\", \"gold\": null}\n");

        Assert.Equal(3, input.Count);
        Assert.Equal(["bats", "sun", "4"], claims.Select(c => c.Id));
        Assert.Equal("The sun orbits the earth.", claims[1].Text);
        Assert.Equal([true, false, null], claims.Select(c => c.Gold));
        Assert.Equal(["biology", "easy"], claims[0].Tags);
        Assert.Empty(input.Problems);
    }

    [Fact]
    public async Task Open_PlainText_OneClaimPerLineWithLineNumberIds()
    {
        using var folder = new TempDirectory();
        var (claims, _) = await OpenAsync(folder, "claims.txt", "Bats are mammals.\n\n  Ice sinks in water.  \r\nCopper conducts electricity.");

        Assert.Equal(["1", "3", "4"], claims.Select(c => c.Id));
        Assert.Equal(["Bats are mammals.", "Ice sinks in water.", "Copper conducts electricity."], claims.Select(c => c.Text));
    }

    [Fact]
    public async Task Open_Csv_HeaderNamesColumnsQuotedFieldsKeepCommasQuotesAndLineBreaks()
    {
        using var folder = new TempDirectory();
        var (claims, input) = await OpenAsync(folder, "claims.csv",
            "Claim,ID,gold,tags\n" +
            "\"Bats, unlike birds, are mammals.\",bats,yes,biology;easy\n" +
            "\"The sign said \"\"closed\"\".\",sign,0,\n" +
            "\"Two\nlines\",two,,\n");

        Assert.Empty(input.Problems);
        Assert.Equal(["bats", "sign", "two"], claims.Select(c => c.Id));
        Assert.Equal(["Bats, unlike birds, are mammals.", "The sign said \"closed\".", "Two\nlines"], claims.Select(c => c.Text));
        Assert.Equal([true, false, null], claims.Select(c => c.Gold));
        Assert.Equal(["biology", "easy"], claims[0].Tags);
    }

    [Theory]
    [InlineData("{\"id\": \"a\"}", "claims.jsonl:1: claim: missing or empty")]
    [InlineData("{\"id\": \"a\", \"claim\": \"   \"}", "claims.jsonl:1: claim: missing or empty")]
    [InlineData("{\"id\": \"a\", \"claim\": 3}", "claims.jsonl:1: claim: missing or empty")]
    [InlineData("{\"id\": \"a\", \"claim\": \"x\", \"gold\": \"maybe\"}", "claims.jsonl:1: gold: unknown label 'maybe' (use true, false, yes, no, 1 or 0, or leave it out)")]
    [InlineData("{\"id\": \"a\", \"claim\": \"x\", \"gold\": 1}", "claims.jsonl:1: gold: expected true, false or null, found a number")]
    [InlineData("{\"id\": 7, \"claim\": \"x\"}", "claims.jsonl:1: id: expected a string, found a number")]
    [InlineData("{\"id\": \"\", \"claim\": \"x\"}", "claims.jsonl:1: id: empty")]
    [InlineData("{\"claim\": \"x\", \"tags\": \"a\"}", "claims.jsonl:1: tags: expected an array of strings, found a string")]
    [InlineData("{\"claim\": \"x\", \"tags\": [\"a\", 2]}", "claims.jsonl:1: tags[1]: expected a string, found a number")]
    [InlineData("{\"claim\": \"x\", \"glod\": true}", "claims.jsonl:1: glod: unknown field (known: id, claim, gold, tags)")]
    [InlineData("{\"claim\": \"x\", \"claim\": \"y\"}", "claims.jsonl:1: claim: given twice")]
    [InlineData("[\"x\"]", "claims.jsonl:1: expected a JSON object, found an array")]
    [InlineData("{\"claim\": \"x\"", "claims.jsonl:1: invalid JSON at byte 14 of the line")]
    public async Task Open_BadJsonLine_ProblemNamesFileLineAndFieldAndTheRestIsKept(string line, string expected)
    {
        var problem = await ProblemAsync(line);

        Assert.Equal(expected, problem);
        Assert.DoesNotContain('\n', problem);
    }

    [Theory]
    [InlineData("id,claim\nx,\"never closed\ny,fine\n", "claims.csv:2: claim: unterminated quoted field: its closing quote is missing, so it runs to the end of the input")]
    [InlineData("id,claim\nx,half\"quoted\"\n", "claims.csv:2: claim: quote inside an unquoted field (quote the whole field and double the quote)")]
    [InlineData("id,claim\nx,\"quoted\"tail\n", "claims.csv:2: claim: text after the closing quote of a quoted field")]
    [InlineData("id,claim\nx,one,two\n", "claims.csv:2: expected 2 fields (id, claim), found 3")]
    [InlineData("id,claim,gold\nx,y,perhaps\n", "claims.csv:2: gold: unknown label 'perhaps' (use true, false, yes, no, 1 or 0, or leave it out)")]
    [InlineData("id,claim\nx,\n", "claims.csv:2: claim: missing or empty")]
    public async Task Open_BadCsvRecord_ProblemNamesLineAndColumn(string text, string expected)
    {
        using var folder = new TempDirectory();
        var input = await ClaimInput.OpenFileAsync(folder.Write("claims.csv", text), ClaimFileFormat.Auto, CancellationToken.None);

        Assert.Equal(expected.Replace("claims.csv", folder.File("claims.csv"), StringComparison.Ordinal), Assert.Single(input.Problems).Message);
    }

    [Theory]
    [InlineData("id,text\nx,y\n", "text: unknown column in the header (known: id, claim, gold, tags)")]
    [InlineData("id,gold\nx,true\n", "the header has no 'claim' column (columns: id, claim, gold, tags)")]
    [InlineData("claim,Claim\nx,y\n", "claim: column named twice in the header")]
    public async Task Open_BadCsvHeader_TheWholeInputIsRefused(string text, string expected)
    {
        using var folder = new TempDirectory();
        var path = folder.Write("claims.csv", text);

        var error = await Assert.ThrowsAsync<ClaimFileException>(() => ClaimInput.OpenFileAsync(path, ClaimFileFormat.Auto, CancellationToken.None));

        Assert.Equal($"{path}:1: {expected}", error.Message);
    }

    [Fact]
    public async Task Open_DuplicateId_SecondUseRefusedFirstKept()
    {
        using var folder = new TempDirectory();
        var (claims, input) = await OpenAsync(folder, "claims.jsonl", "{\"id\": \"a\", \"claim\": \"x\"}\n{\"id\": \"b\", \"claim\": \"y\"}\n{\"id\": \"a\", \"claim\": \"z\"}\n");

        Assert.Equal(["a", "b"], claims.Select(c => c.Id));
        Assert.Equal(["x", "y"], claims.Select(c => c.Text));
        Assert.EndsWith("claims.jsonl:3: id: duplicate id 'a' (first used on line 1)", Assert.Single(input.Problems).Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Open_ExplicitIdEqualToAnotherLinesNumber_IsADuplicate()
    {
        using var folder = new TempDirectory();
        var (_, input) = await OpenAsync(folder, "claims.jsonl", "{\"id\": \"2\", \"claim\": \"x\"}\n{\"claim\": \"y\"}\n");

        Assert.EndsWith("claims.jsonl:2: id: duplicate id '2' (first used on line 1)", Assert.Single(input.Problems).Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("claims.jsonl", "")]
    [InlineData("claims.jsonl", "\n   \n")]
    [InlineData("claims.txt", "\n\n")]
    [InlineData("claims.csv", "")]
    public async Task Open_NoClaim_IsAnError(string name, string text)
    {
        using var folder = new TempDirectory();
        var path = folder.Write(name, text);

        var error = await Assert.ThrowsAsync<ClaimFileException>(() => ClaimInput.OpenFileAsync(path, ClaimFileFormat.Auto, CancellationToken.None));

        Assert.Equal($"{path}:1: the input holds no claim", error.Message);
    }

    [Fact]
    public async Task OpenStream_StandardInput_SniffsTheFormatAndNamesItStdin()
    {
        var csv = new MemoryStream(Encoding.UTF8.GetBytes("id,claim\nq1,From CSV\nq2,\"Quoted, with comma\"\nq3,\n"));

        using var input = await ClaimInput.OpenStreamAsync(csv, ClaimFileFormat.Auto, CancellationToken.None);
        var claims = new List<Claim>();
        await foreach (var claim in input.ReadAsync(CancellationToken.None))
        {
            claims.Add(claim);
        }

        Assert.Equal(["q1", "q2"], claims.Select(c => c.Id));
        Assert.Equal("stdin:4: claim: missing or empty", Assert.Single(input.Problems).Message);
    }

    [Theory]
    [InlineData("{\"claim\": \"x\"}\n", "x")]
    [InlineData("A claim, with a comma.\nAnother claim.\n", "A claim, with a comma.")]
    public async Task OpenStream_NoHeader_JsonOrPlainText(string text, string firstClaim)
    {
        using var input = await ClaimInput.OpenStreamAsync(new MemoryStream(Encoding.UTF8.GetBytes(text)), ClaimFileFormat.Auto, CancellationToken.None);

        await foreach (var claim in input.ReadAsync(CancellationToken.None))
        {
            Assert.Equal(firstClaim, claim.Text);
            return;
        }

        Assert.Fail("no claim read");
    }

    [Fact]
    public async Task ReadAsync_TwiceOverTheSameInput_SameClaims()
    {
        using var folder = new TempDirectory();
        var (first, input) = await OpenAsync(folder, "claims.txt", "One.\nTwo.\nThree.\n");

        var second = new List<string>();
        await foreach (var claim in input.ReadAsync(CancellationToken.None))
        {
            second.Add(claim.Text);
        }

        Assert.Equal(first.Select(c => c.Text), second);
    }
}
