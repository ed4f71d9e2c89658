using System.Xml;
using System.Xml.Linq;
using System.Xml.Schema;
using Plumbline.Core.Runs;
using Plumbline.Reports.Junit;
using Plumbline.Reports.Model;
using Plumbline.Reports.Tests.Fixtures;

namespace Plumbline.Reports.Tests.Junit;

/// <summary>
/// JUnit XML checked against the published schema: data/junit/junit-10.xsd, copied unchanged from
/// jenkinsci/xunit-plugin @ 031e285ef3b60dee7aaf36e9096d7dcd95ffae83 (MIT; see data/junit/SOURCES.md).
/// </summary>
public sealed class JunitReportWriterTests
{
    private static readonly Lazy<XmlSchemaSet> Schema = new(() =>
    {
        var set = new XmlSchemaSet();
        set.Add(null, Path.Combine(AppContext.BaseDirectory, "data", "junit", "junit-10.xsd"));
        set.Compile();
        return set;
    });

    private static async Task<string> WriteAsync(RunReport report, JunitFailures failures = JunitFailures.Default) =>
        await ReportOutput.TextAsync(new JunitReportWriter(failures), report);

    /// <summary>Every schema error, empty when the document is valid.</summary>
    internal static List<string> SchemaErrors(string xml)
    {
        var errors = new List<string>();
        var settings = new XmlReaderSettings { ValidationType = ValidationType.Schema, Schemas = Schema.Value };
        settings.ValidationEventHandler += (_, e) => errors.Add($"{e.Severity} line {e.Exception?.LineNumber}: {e.Message}");
        using var reader = XmlReader.Create(new StringReader(xml), settings);
        while (reader.Read())
        {
        }

        return errors;
    }

    [Fact]
    public async Task WriteAsync_MixedReport_ValidAgainstThePublishedSchema()
    {
        var xml = await WriteAsync(SampleReports.Mixed());

        Assert.Empty(SchemaErrors(xml));
    }

    [Fact]
    public void SchemaErrors_BrokenDocument_Found()
    {
        // A test case without its required name must be refused, or the validation above proves nothing.
        var errors = SchemaErrors("<testsuites><testsuite name=\"s\" tests=\"1\" failures=\"0\" errors=\"0\"><testcase classname=\"c\"/></testsuite></testsuites>");

        Assert.NotEmpty(errors);
    }

    [Fact]
    public async Task WriteAsync_DefaultFailures_OverturnedFailsFailedIsAnError()
    {
        var document = XDocument.Parse(await WriteAsync(SampleReports.Mixed()));
        var suite = document.Root!.Element("testsuite")!;
        var cases = suite.Elements("testcase").ToList();

        // By hand: c1 settled and agrees with gold (passes), c2 overturned (fails), c3 failed (an error).
        Assert.Equal(("3", "1", "1", "0"), ((string)suite.Attribute("tests")!, (string)suite.Attribute("failures")!, (string)suite.Attribute("errors")!, (string)suite.Attribute("skipped")!));
        Assert.Equal(["c1: Water boils at 100 degrees Celsius at sea level.", "c2: Glass is a liquid.", "c3: The moon is made of cheese."],
            cases.Select(c => (string)c.Attribute("name")!));
        Assert.Null(cases[0].Element("failure"));
        Assert.Equal("overturned", (string)cases[1].Element("failure")!.Attribute("type")!);
        Assert.StartsWith("overturned: answer false, direct answer true, gold false, margin 0.5", (string)cases[1].Element("failure")!.Attribute("message")!, StringComparison.Ordinal);
        Assert.Equal(SampleReports.FailureReason, (string)cases[2].Element("error")!.Attribute("message")!);
        Assert.Equal("plumb.claims.physics.easy", (string)cases[0].Attribute("classname")!);
    }

    [Fact]
    public async Task WriteAsync_GoldOnly_NothingFailsBecauseBothAnswersAgreeWithGold()
    {
        var document = XDocument.Parse(await WriteAsync(SampleReports.Mixed(), JunitFailures.Gold));
        var suite = document.Root!.Element("testsuite")!;

        Assert.Equal(("0", "0"), ((string)suite.Attribute("failures")!, (string)suite.Attribute("errors")!));
        Assert.Empty(suite.Descendants("failure"));
    }

    [Fact]
    public async Task WriteAsync_NotJudgedAndGates_SkippedCasesAndAGateSuite()
    {
        var report = SampleReports.Report(
            [SampleReports.Settled],
            SampleReports.Started.AddSeconds(2),
            completion: new RunCompletion("interrupted", ["c8", "c9"], []),
            gates: [new GateResult("coherent_accuracy", 1.0, ">=", 0.8, true), new GateResult("overturn_rate", 0.5, "<=", 0.2, false)]);

        var xml = await WriteAsync(report);
        var document = XDocument.Parse(xml);

        Assert.Empty(SchemaErrors(xml));
        var suites = document.Root!.Elements("testsuite").ToList();
        Assert.Equal(["c8", "c9"], suites[0].Elements("testcase").Where(c => c.Element("skipped") is not null).Select(c => (string)c.Attribute("name")!));
        Assert.Equal("2", (string)suites[0].Attribute("skipped")!);
        Assert.Equal(("plumb gates", "2", "1"), ((string)suites[1].Attribute("name")!, (string)suites[1].Attribute("tests")!, (string)suites[1].Attribute("failures")!));
        Assert.Equal("overturn_rate = 0.5, wanted <= 0.2", (string)suites[1].Descendants("failure").Single().Attribute("message")!);
    }

    [Fact]
    public async Task WriteAsync_Notice_AProperty()
    {
        var document = XDocument.Parse(await WriteAsync(SampleReports.Mixed()));

        Assert.Equal(ReportNotice.Text, (string)document.Descendants("property").Single(p => (string)p.Attribute("name")! == "notice").Attribute("value")!);
    }
}
