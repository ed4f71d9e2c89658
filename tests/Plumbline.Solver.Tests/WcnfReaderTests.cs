using System.Text.RegularExpressions;
using Plumbline.Core.MaxSat;
using Plumbline.Solver.Wcnf;
using Xunit;

namespace Plumbline.Solver.Tests;

public sealed class WcnfReaderTests
{
    private static WcnfInstance Parse(string text, string source = "test.wcnf") =>
        WcnfReader.Read(new StringReader(text), source);

    private static WcnfFormatException ParseError(string text, string source = "bad.wcnf") =>
        Assert.Throws<WcnfFormatException>(() => Parse(text, source));

    [Fact]
    public void Read_HeaderWithTop_WeightAtOrAboveTopIsHard()
    {
        var instance = Parse("c example\np wcnf 3 4 10\n10 1 2 0\n11 -1 0\n9 -2 3 0\n1 -3 0\n");

        Assert.Equal(WcnfFormat.Pre2022Weighted, instance.Format);
        Assert.Equal(10, instance.Top);
        Assert.Equal(3, instance.Problem.VariableCount);
        Assert.Equal([true, true, false, false], instance.Problem.Clauses.Select(c => c.IsHard));
        Assert.Equal([9L, 1L], instance.Problem.Clauses.Where(c => !c.IsHard).Select(c => c.Weight));
        Assert.Equal([-2, 3], instance.Problem.Clauses[2].Literals);
        Assert.Equal(["example"], instance.Comments);
    }

    [Fact]
    public void Read_HeaderWithoutTop_EveryClauseIsSoft()
    {
        // Double space in the header and leading spaces on clause lines, as in real pre-2022 files.
        var instance = Parse("p wcnf 4  2\n 956 1 2 4 0\n 696 1 -3 0\n");

        Assert.Null(instance.Top);
        Assert.Equal(0, instance.HardClauseCount);
        Assert.Equal([956L, 696L], instance.Problem.Clauses.Select(c => c.Weight));
    }

    [Fact]
    public void Read_CnfHeader_EveryClauseSoftWithWeightOne()
    {
        var instance = Parse("p cnf 3 2\n1 -2 0\n2 3 0\n");

        Assert.Equal(WcnfFormat.Pre2022Unweighted, instance.Format);
        Assert.All(instance.Problem.Clauses, c => Assert.Equal((1L, false), (c.Weight, c.IsHard)));
        Assert.Equal([1, -2], instance.Problem.Clauses[0].Literals);
        Assert.Equal([2, 3], instance.Problem.Clauses[1].Literals);
    }

    [Fact]
    public void Read_NoHeader_HardMarkerAndWeights()
    {
        var instance = Parse("c 2022 style\nh 1 2 0\n3 -1 0\n7 -2 5 0\n");

        Assert.Equal(WcnfFormat.Since2022, instance.Format);
        Assert.Null(instance.Top);
        Assert.Equal(5, instance.Problem.VariableCount);
        Assert.Equal(
            [(true, 0L), (false, 3L), (false, 7L)],
            instance.Problem.Clauses.Select(c => (c.IsHard, c.Weight)));
    }

    [Fact]
    public void Read_ClauseSpanningLinesWithCommentsBetween_EndsAtZero()
    {
        var instance = Parse("h 1\n  2\nc inside a clause\n 3 0 5 -1\n-2 0\nc trailing\n");

        Assert.Equal(2, instance.Problem.Clauses.Count);
        Assert.Equal([1, 2, 3], instance.Problem.Clauses[0].Literals);
        Assert.Equal([-1, -2], instance.Problem.Clauses[1].Literals);
        Assert.Equal(5, instance.Problem.Clauses[1].Weight);
        Assert.Equal(["inside a clause", "trailing"], instance.Comments);
    }

    [Fact]
    public void Read_TabsCarriageReturnsAndEmptyClauses_AreAccepted()
    {
        var instance = Parse("p wcnf 2 3 5\r\n5\t1\t2 0\r\n\r\n5 0\r\n2 0\r\n");

        Assert.Equal([true, true, false], instance.Problem.Clauses.Select(c => c.IsHard));
        Assert.Empty(instance.Problem.Clauses[1].Literals);
        Assert.Empty(instance.Problem.Clauses[2].Literals);
    }

    /// <summary>
    /// The instance header written as JSON in comment lines (nvars, ncls, nhards, nsofts) is an independent count to
    /// check the reader against; files from chrjabs/rustsat data/ (see data/wcnf/SOURCES.md).
    /// </summary>
    [Theory]
    [InlineData("new-format/auctions_wt-cat_sched_60_70_0003.txt.wcnf")]
    [InlineData("new-format/pre-processing_c_inference_50_54_fq15.wcnf")]
    public async Task ReadFileAsync_FileWithJsonCommentHeader_CountsMatchTheHeader(string file)
    {
        var instance = await WcnfReader.ReadFileAsync(TestData.Wcnf(file), CancellationToken.None);
        var json = string.Join("\n", instance.Comments);

        Assert.Equal(JsonCount(json, "nvars"), instance.Problem.VariableCount);
        Assert.Equal(JsonCount(json, "ncls"), instance.Problem.Clauses.Count);
        Assert.Equal(JsonCount(json, "nhards"), instance.HardClauseCount);
        Assert.Equal(JsonCount(json, "nsofts"), instance.SoftClauseCount);
        Assert.Equal(WcnfFormat.Since2022, instance.Format);
    }

    [Fact]
    public async Task ReadFileAsync_CommentAfterClauses_IsKeptAndClauseCountMatchesHeader()
    {
        // 8.wcsp.log.wcnf (logic-ng/LogicNG) ends with a comment line after its last clause; header: p wcnf 12 25 13.
        var instance = await WcnfReader.ReadFileAsync(TestData.Wcnf("old-format/8.wcsp.log.wcnf"), CancellationToken.None);

        Assert.Equal(25, instance.Problem.Clauses.Count);
        Assert.Equal(12, instance.Problem.VariableCount);
        Assert.Equal(13, instance.Top);
        Assert.Contains("./../WCSP/SPOT5/8.wcsp", instance.Comments);
    }

    [Fact]
    public void Read_MalformedWeight_NamesFileLineAndField()
    {
        var error = ParseError("c one\np wcnf 3 2 9\n9 1 2 0\n\nc five\n\nx 1 0\n");

        Assert.Equal("bad.wcnf:7: clause weight: 'x' is not a positive integer", error.Message);
        Assert.Equal(("bad.wcnf", 7, "clause weight"), (error.File, error.Line, error.Field));
    }

    [Theory]
    [InlineData("h 1 0\n0 1 0\n", 2)]
    [InlineData("h 1 0\n-4 1 0\n", 2)]
    [InlineData("1.5 1 0\n", 1)]
    [InlineData("99999999999999999999 1 0\n", 1)]
    public void Read_WeightNotPositiveInteger_IsRejected(string text, int line)
    {
        var error = ParseError(text);

        Assert.Equal(("clause weight", line), (error.Field, error.Line));
        Assert.Matches(new Regex(@"^bad\.wcnf:\d+: clause weight: '.+' is not a positive integer$"), error.Message);
    }

    [Fact]
    public void Read_LiteralOutOfRange_NamesLiteralAndDeclaredCount()
    {
        var error = ParseError("p wcnf 5 2 10\n10 1 2 0\n3 -6 0\n");

        Assert.Equal("bad.wcnf:3: literal: -6 is out of range (header declares 5 variables)", error.Message);
        Assert.Equal(("literal", 3), (error.Field, error.Line));
    }

    [Theory]
    [InlineData("h 1 a 0\n", "'a' is not an integer")]
    [InlineData("h 1 3000000000 0\n", "'3000000000' is not an integer")]
    public void Read_LiteralNotAnInteger_IsRejected(string text, string problem)
    {
        var error = ParseError(text);

        Assert.Equal($"bad.wcnf:1: literal: {problem}", error.Message);
    }

    [Fact]
    public void Read_MissingTerminatingZero_ReportsWhereTheClauseStarted()
    {
        var error = ParseError("h 1 2 0\n4 1\n -2\nc end\n");

        Assert.Equal("clause", error.Field);
        Assert.Equal(4, error.Line);
        Assert.Equal(
            "bad.wcnf:4: clause: missing terminating 0 at end of file (the clause starts on line 2)",
            error.Message);
    }

    [Theory]
    [InlineData("p wcnf 3\n", 1, "header nbclauses", "missing")]
    [InlineData("p wcnf x 2 5\n", 1, "header nbvar", "'x' is not a non-negative integer")]
    [InlineData("p wcnf 3 -2\n", 1, "header nbclauses", "'-2' is not a non-negative integer")]
    [InlineData("c hi\np wcnf 3 1 0\n", 2, "header top", "'0' is not a positive integer")]
    [InlineData("p wncf 3 1 5\n", 1, "header format", "'wncf' is neither 'wcnf' nor 'cnf'")]
    [InlineData("p\n", 1, "header format", "missing")]
    [InlineData("p cnf 3 1 5\n", 1, "header", "unexpected extra field '5'")]
    [InlineData("p wcnf 3 1 5 7\n", 1, "header", "unexpected extra field '7'")]
    [InlineData("pwcnf 3 1 5\n", 1, "header", "'pwcnf' is not 'p'; a header reads 'p wcnf nbvar nbclauses [top]'")]
    [InlineData("p wcnf 3 1 5\np wcnf 3 1 5\n", 2, "header", "second p line (the first is on line 1)")]
    [InlineData("h 1 0\np wcnf 3 1 5\n", 2, "header", "p line after the first clause; it must come before every clause")]
    [InlineData("p wcnf 3 2 5\n5 1 0\n", 1, "header nbclauses", "header declares 2 clauses but the file has 1")]
    [InlineData("p wcnf 3 1 5\nh 1 0\n", 2, "clause weight", "'h' marks a hard clause only in the 2022 format, and this file has a p line")]
    public void Read_BadHeader_NamesFileLineAndField(string text, int line, string field, string problem)
    {
        var error = ParseError(text);

        Assert.Equal($"bad.wcnf:{line}: {field}: {problem}", error.Message);
        Assert.Equal((line, field, problem), (error.Line, error.Field, error.Problem));
    }

    [Fact]
    public void Read_SoftWeightsOverflow64Bits_IsRejectedAtTheClause()
    {
        var error = ParseError($"h 1 0\n{long.MaxValue} 1 0\n1 -1 0\n");

        Assert.Equal($"bad.wcnf:3: clause weight: the soft weights add up to more than {long.MaxValue}", error.Message);
    }

    [Fact]
    public void Read_HardWeightsAboveTop_DoNotCountTowardsTheSoftSum()
    {
        var instance = Parse($"p wcnf 1 3 {long.MaxValue}\n{long.MaxValue} 1 0\n{long.MaxValue} 1 0\n{long.MaxValue - 1} -1 0\n");

        Assert.Equal(2, instance.HardClauseCount);
        Assert.Equal(long.MaxValue - 1, instance.Problem.Clauses[2].Weight);
    }

    [Fact]
    public void Read_EmptyText_GivesEmptyProblem()
    {
        var instance = Parse("c nothing here\n");

        Assert.Equal(0, instance.Problem.VariableCount);
        Assert.Empty(instance.Problem.Clauses);
    }

    [Fact]
    public async Task ReadFileAsync_MissingFile_ThrowsIOException()
    {
        using var missing = new TempFile();

        await Assert.ThrowsAnyAsync<IOException>(() => WcnfReader.ReadFileAsync(missing.Path, CancellationToken.None));
    }

    [Fact]
    public async Task ReadFileAsync_ErrorInFile_NamesThePathGiven()
    {
        using var bad = await TempFile.WithTextAsync("h 1 0\nh 2 z 0\n");

        var error = await Assert.ThrowsAsync<WcnfFormatException>(
            () => WcnfReader.ReadFileAsync(bad.Path, CancellationToken.None));

        Assert.Equal($"{bad.Path}:2: literal: 'z' is not an integer", error.Message);
    }

    private static int JsonCount(string json, string key)
    {
        var match = Regex.Match(json, $"\"{key}\"\\s*:\\s*(\\d+)");
        Assert.True(match.Success, $"no {key} in the comment header");
        return int.Parse(match.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture);
    }
}
