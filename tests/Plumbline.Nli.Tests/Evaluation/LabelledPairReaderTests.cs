using Plumbline.Core.Entailment;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Nli.Tests.Evaluation;

public sealed class LabelledPairReaderTests
{
    private static string Sample(string name) => Path.Combine(AppContext.BaseDirectory, "data", "eval", name);

    [Fact]
    public void Read_QuotedCsvWithCrLf_ParsesFieldsLabelsAndLines()
    {
        var set = LabelledPairReader.Read(Sample("pairs.csv"));

        Assert.Equal(1, set.SkippedUnlabelled);
        Assert.Equal(
            [
                new LabelledPair(new SentencePair("A man, a plan, a canal.", "A plan exists."), EntailmentKind.Entailment, 2),
                new LabelledPair(new SentencePair("She said \"no\" twice.", "She agreed."), EntailmentKind.Contradiction, 3),
                new LabelledPair(new SentencePair("A poem:\r\ntwo lines here.", "A poem has lines."), EntailmentKind.Neutral, 4),
                new LabelledPair(new SentencePair("Plain fields work too.", "They do."), EntailmentKind.Entailment, 8),
            ],
            set.Pairs);
    }

    [Fact]
    public void Read_TsvWithUnescapedQuotes_TakesFieldsVerbatim()
    {
        var set = LabelledPairReader.Read(Sample("pairs.tsv"));

        Assert.Equal(1, set.SkippedUnlabelled);
        Assert.Equal(3, set.Pairs.Count);
        Assert.Equal(new SentencePair("A dog \"barks\" loudly.", "An animal makes noise."), set.Pairs[0].Pair);
        Assert.Equal([EntailmentKind.Entailment, EntailmentKind.Contradiction, EntailmentKind.Neutral], set.Pairs.Select(pair => pair.Gold));
        Assert.Equal(5, set.Pairs[2].Line);
    }

    [Fact]
    public void Read_JsonLinesWithBothNamingsAndIndexLabels_ParsesAndSkipsUnlabelled()
    {
        var set = LabelledPairReader.Read(Sample("pairs.jsonl"));

        Assert.Equal(2, set.SkippedUnlabelled);
        Assert.Equal(
            [
                new LabelledPair(new SentencePair("The train left at noon.", "The train left."), EntailmentKind.Entailment, 1),
                new LabelledPair(new SentencePair("It is raining.", "The ground is dry."), EntailmentKind.Contradiction, 2),
                new LabelledPair(new SentencePair("A cat sleeps.", "A cat naps on a sofa."), EntailmentKind.Neutral, 4),
            ],
            set.Pairs);
    }

    [Theory]
    [InlineData("bad.csv", "premise,hypothesis,label\nA.,B.,entailment\nC.,D.,maybe\n", 3, "label", "unknown label 'maybe'")]
    [InlineData("bad.csv", "premise,hypothesis,label\nA.,B.,entailment\n\"C., never closed,neutral\n", 3, "premise", "never closed")]
    [InlineData("bad.csv", "premise,hypothesis,label\n\"A.\"x,B.,entailment\n", 2, "premise", "after the closing quote")]
    [InlineData("bad.csv", "premise,hypothesis,label\nA.,B.\n", 2, "label", "missing: row has 2 fields")]
    [InlineData("bad.csv", "premise,label\nA.,entailment\n", 1, "hypothesis", "no hypothesis or sentence2 column")]
    [InlineData("bad.csv", "premise,hypothesis,label\nA.,B.,\n", 2, "label", "missing label")]
    [InlineData("bad.tsv", "sentence1\tsentence2\tgold_label\nA.\tB.\tneutral\nC.\tD.\tyes\n", 3, "gold_label", "unknown label 'yes'")]
    [InlineData("bad.jsonl", "{\"premise\": \"A.\", \"hypothesis\": \"B.\", \"label\": \"neutral\"}\n{\"premise\": \"A.\", \"hypothesis\": \"B.\", \"label\": \"neutral\"\n", 2, "row", "not valid JSON")]
    [InlineData("bad.jsonl", "\n{\"premise\": \"A.\", \"label\": \"neutral\"}\n", 2, "hypothesis", "no hypothesis or sentence2 field")]
    [InlineData("bad.jsonl", "{\"premise\": 3, \"hypothesis\": \"B.\", \"label\": \"neutral\"}\n", 1, "premise", "must be a string")]
    [InlineData("bad.jsonl", "[1, 2]\n", 1, "row", "expected a JSON object")]
    public void Read_BadRow_OneLineErrorNamesFileLineAndField(string name, string content, int line, string field, string problem)
    {
        var path = Path.Combine(Directory.CreateTempSubdirectory("plumbline-eval-").FullName, name);
        File.WriteAllText(path, content);
        try
        {
            var error = Assert.Throws<LabelledPairFormatException>(() => LabelledPairReader.Read(path));

            Assert.Equal((path, line, field), (error.File, error.Line, error.Field));
            Assert.StartsWith($"{path}:{line}: {field}: ", error.Message, StringComparison.Ordinal);
            Assert.Contains(problem, error.Message, StringComparison.Ordinal);
            Assert.DoesNotContain('\n', error.Message);
        }
        finally
        {
            Directory.Delete(Path.GetDirectoryName(path)!, recursive: true);
        }
    }

    [Fact]
    public void Read_UnknownExtension_NamesFile()
    {
        var error = Assert.Throws<LabelledPairFormatException>(() => LabelledPairReader.Read("pairs.xlsx"));

        Assert.Equal("pairs.xlsx", error.File);
        Assert.Contains(".xlsx", error.Message, StringComparison.Ordinal);
    }
}
