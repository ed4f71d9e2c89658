using System.Text.Json;
using System.Xml.Linq;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>
/// Every format of one sample run shows the hand-checked verdicts of two claims: an overturned one and a settled one.
/// The expected values are the rows of <see cref="SampleSweepTests.ExpectedVerdicts"/> (checked by hand, see
/// samples/thistlewick/EXPECTED.md), not anything this code wrote before.
/// </summary>
public sealed class SampleFormatsTests(SampleSweep sweep) : IClassFixture<SampleSweep>
{
    public static TheoryData<string> HandChecked => ["blender-jug", "toaster-slots"];

    private static (bool Direct, bool Answer, string Status, double Margin) Expected(string id)
    {
        var row = SampleSweepTests.ExpectedVerdicts.Single(r => (string)r[0] == id);
        return ((bool)row[1], (bool)row[2], (string)row[3], (double)row[4]);
    }

    private static string Word(bool answer) => answer ? "true" : "false";

    private static string Number(double value) => value.ToString("0.0###", System.Globalization.CultureInfo.InvariantCulture);

    [Fact]
    public void Sweep_EveryReport_Written()
    {
        Assert.True(sweep.Result.ExitCode == 0, sweep.Result.ToString());
        Assert.All(new[] { "text", "md", "html", "junit", "jsonl" }, f => Assert.True(new FileInfo(sweep.FileOf(f)).Length > 0, f));
    }

    [Theory]
    [MemberData(nameof(HandChecked))]
    public void Text_AnswerLine_AsCheckedByHand(string id)
    {
        var (direct, answer, status, margin) = Expected(id);
        var lines = File.ReadAllLines(sweep.FileOf("text"));

        var at = Array.FindIndex(lines, l => l.StartsWith(id + "  ", StringComparison.Ordinal));
        Assert.True(at >= 0, $"no block for {id}");
        Assert.StartsWith($"  answer {Word(answer)} | direct answer {Word(direct)} | gold ", lines[at + 1], StringComparison.Ordinal);
        Assert.Contains($" | {status} | margin {Number(margin)} (normalised ", lines[at + 1], StringComparison.Ordinal);
    }

    [Theory]
    [MemberData(nameof(HandChecked))]
    public void JsonLines_ClaimRecord_AsCheckedByHand(string id)
    {
        var (direct, answer, status, margin) = Expected(id);
        var record = File.ReadLines(sweep.FileOf("jsonl"))
            .Select(l => JsonDocument.Parse(l).RootElement)
            .Single(r => r.GetProperty("record").GetString() == "claim" && r.GetProperty("id").GetString() == id);

        Assert.Equal((direct, answer, status), (record.GetProperty("direct_answer").GetBoolean(), record.GetProperty("answer").GetBoolean(), record.GetProperty("status").GetString()));
        Assert.Equal(margin, record.GetProperty("margin").GetDouble(), 3);
        Assert.Equal(answer, record.GetProperty("statements")[0].GetProperty("value").GetBoolean());
    }

    [Fact]
    public void JsonLines_EveryLine_ValidAgainstTheLinesSchema()
    {
        foreach (var line in File.ReadLines(sweep.FileOf("jsonl")))
        {
            var results = Plumbline.Reports.Tests.Schema.ReportSchemaFile.EvaluateLine(line);
            Assert.True(results.IsValid, Plumbline.Reports.Tests.Schema.ReportSchemaFile.Describe(results));
        }
    }

    [Theory]
    [MemberData(nameof(HandChecked))]
    public void Markdown_OverturnedListedSettledNot(string id)
    {
        var (direct, answer, status, margin) = Expected(id);
        var text = File.ReadAllText(sweep.FileOf("md"));

        Assert.Contains("| figure | value |", text, StringComparison.Ordinal);
        var row = text.Split('\n').FirstOrDefault(l => l.StartsWith($"| {id} |", StringComparison.Ordinal));
        if (status == "settled")
        {
            Assert.Null(row);
        }
        else
        {
            Assert.NotNull(row);
            Assert.Contains($"| {Word(direct)} | **{Word(answer)}** | ", row, StringComparison.Ordinal);
            Assert.Contains($"| {Number(margin)} (", row, StringComparison.Ordinal);
        }
    }

    [Theory]
    [MemberData(nameof(HandChecked))]
    public void Junit_OverturnedFailsSettledPasses(string id)
    {
        var (_, _, status, _) = Expected(id);
        var xml = File.ReadAllText(sweep.FileOf("junit"));
        var testCase = XDocument.Parse(xml).Descendants("testcase").Single(c => ((string)c.Attribute("name")!).StartsWith(id + ": ", StringComparison.Ordinal));

        Assert.Equal(status == "overturned" ? "overturned" : null, (string?)testCase.Element("failure")?.Attribute("type"));
    }

    [Theory]
    [MemberData(nameof(HandChecked))]
    public void Html_TableRowAndTree_AsCheckedByHand(string id)
    {
        var (direct, answer, status, _) = Expected(id);
        var html = File.ReadAllText(sweep.FileOf("html"));

        var row = html.Split('\n').Single(l => l.StartsWith("<tr data-claim", StringComparison.Ordinal) && l.Contains($">{id}</a>", StringComparison.Ordinal));
        Assert.Contains($"data-status=\"{status}\"", row, StringComparison.Ordinal);
        Assert.Contains($"<td>{Word(direct)}</td><td><b>{Word(answer)}</b></td>", row, StringComparison.Ordinal);
    }

    [Fact]
    public void Html_SelfContained_NoExternalReference()
    {
        var html = File.ReadAllText(sweep.FileOf("html"));

        // The SVG namespace is a name, not a fetch; every other URL or source attribute would be.
        var withoutNamespace = html.Replace("xmlns=\"http://www.w3.org/2000/svg\"", "", StringComparison.Ordinal);
        Assert.DoesNotContain("http://", withoutNamespace, StringComparison.Ordinal);
        Assert.DoesNotContain("https://", withoutNamespace, StringComparison.Ordinal);
        Assert.DoesNotContain(" src=", withoutNamespace, StringComparison.Ordinal);
        Assert.DoesNotContain("<link", withoutNamespace, StringComparison.Ordinal);
        Assert.DoesNotContain(html.Split("href=\"").Skip(1), href => !href.StartsWith('#'));
    }
}
