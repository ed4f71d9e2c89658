using System.Globalization;
using System.Text;
using System.Xml;
using Plumbline.Core.Coherence;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Junit;

/// <summary>
/// JUnit XML (the testsuites / testsuite / testcase layout CI servers read): one test case per claim, named
/// "id: claim". What fails a case is chosen by <see cref="JunitFailures"/>; a claim that could not be judged is an
/// error when "failed" is chosen, a claim the run never reached is skipped. Gates, when set, are a second suite.
/// The run's settings and the notice travel as properties, the figures as the suite's system-out.
/// </summary>
internal sealed class JunitReportWriter(JunitFailures failures) : IReportWriter
{
    public const string FormatName = "junit";

    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    public string Format => FormatName;

    public async Task WriteAsync(RunReport report, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(output);

        // The suite's counts come first in the file, so the claims are read twice: once to count, once to write.
        int failed = 0, errors = 0;
        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            switch (Outcome(claim))
            {
                case (true, _):
                    errors++;
                    break;
                case (false, { }):
                    failed++;
                    break;
            }
        }

        var skipped = report.Completion.NotJudged.Count;
        var tests = report.Claims.Count + skipped;
        var gateFailures = report.Gates.Count(g => !g.Passed);
        var seconds = Seconds(report.Figures.WallTime);

        var settings = new XmlWriterSettings { Async = true, Encoding = new UTF8Encoding(false), Indent = true, IndentChars = "  ", NewLineChars = "\n" };
        await using var xml = XmlWriter.Create(output, settings);
        await xml.WriteStartDocumentAsync();
        xml.WriteStartElement("testsuites");
        xml.WriteAttributeString("name", "plumb");
        xml.WriteAttributeString("tests", Count(tests + report.Gates.Count));
        xml.WriteAttributeString("failures", Count(failed + gateFailures));
        xml.WriteAttributeString("errors", Count(errors));
        xml.WriteAttributeString("time", seconds);

        xml.WriteStartElement("testsuite");
        xml.WriteAttributeString("name", "plumb claims");
        xml.WriteAttributeString("tests", Count(tests));
        xml.WriteAttributeString("failures", Count(failed));
        xml.WriteAttributeString("errors", Count(errors));
        xml.WriteAttributeString("skipped", Count(skipped));
        xml.WriteAttributeString("time", seconds);
        xml.WriteAttributeString("timestamp", ReportNumbers.Instant(report.Header.Started));
        Properties(xml, report);
        await foreach (var claim in report.Claims.ReadAsync(cancellationToken))
        {
            TestCase(xml, claim);
            await xml.FlushAsync();
        }

        foreach (var id in report.Completion.NotJudged)
        {
            xml.WriteStartElement("testcase");
            xml.WriteAttributeString("name", id);
            xml.WriteAttributeString("classname", "plumb.claims");
            xml.WriteStartElement("skipped");
            xml.WriteAttributeString("message", $"not judged: {report.Completion.StoppedBecause ?? "the run stopped"}");
            xml.WriteEndElement();
            xml.WriteEndElement();
        }

        xml.WriteElementString("system-out", Summary(report));
        xml.WriteEndElement();

        if (report.Gates.Count > 0)
        {
            xml.WriteStartElement("testsuite");
            xml.WriteAttributeString("name", "plumb gates");
            xml.WriteAttributeString("tests", Count(report.Gates.Count));
            xml.WriteAttributeString("failures", Count(gateFailures));
            xml.WriteAttributeString("errors", "0");
            foreach (var gate in report.Gates)
            {
                xml.WriteStartElement("testcase");
                xml.WriteAttributeString("name", gate.Name);
                xml.WriteAttributeString("classname", "plumb.gates");
                if (!gate.Passed)
                {
                    xml.WriteStartElement("failure");
                    xml.WriteAttributeString("type", "gate");
                    xml.WriteAttributeString("message",
                        $"{gate.Name} = {(gate.Value is { } v ? ReportText.Weight(v) : "n/a")}, wanted {gate.Comparison} {ReportText.Weight(gate.Threshold)}");
                    xml.WriteEndElement();
                }

                xml.WriteEndElement();
            }

            xml.WriteEndElement();
        }

        xml.WriteEndElement();
        await xml.WriteEndDocumentAsync();
        await xml.FlushAsync();
        await output.WriteAsync("\n"u8.ToArray(), cancellationToken);
    }

    /// <summary>(error, failure type): an unjudged claim is an error when failed claims count; otherwise the first chosen condition it meets.</summary>
    private (bool Error, string? Failure) Outcome(ClaimReport claim)
    {
        if (claim.Status == ClaimStatus.Failed)
        {
            return (failures.HasFlag(JunitFailures.Failed), null);
        }

        var failure = claim.Status == ClaimStatus.Overturned && failures.HasFlag(JunitFailures.Overturned) ? "overturned"
            : claim.DisagreesWithGold && failures.HasFlag(JunitFailures.Gold) ? "disagrees with gold"
            : claim.Status == ClaimStatus.Contested && failures.HasFlag(JunitFailures.Contested) ? "contested"
            : null;
        return (false, failure);
    }

    private void TestCase(XmlWriter xml, ClaimReport claim)
    {
        xml.WriteStartElement("testcase");
        xml.WriteAttributeString("name", $"{claim.Id}: {ReportText.OneLine(claim.Text)}");
        xml.WriteAttributeString("classname", "plumb.claims" + (claim.Tags.Count > 0 ? "." + string.Join('.', claim.Tags.Select(Safe)) : ""));
        xml.WriteAttributeString("time", Seconds(claim.Timings.Total));
        var (error, failure) = Outcome(claim);
        if (error)
        {
            xml.WriteStartElement("error");
            xml.WriteAttributeString("type", "failed");
            xml.WriteAttributeString("message", ReportText.OneLine(claim.Error ?? "the claim could not be judged"));
            xml.WriteEndElement();
        }
        else if (failure is not null)
        {
            xml.WriteStartElement("failure");
            xml.WriteAttributeString("type", failure);
            xml.WriteAttributeString("message", ReportText.Headline(claim));
            xml.WriteString(Details(claim));
            xml.WriteEndElement();
        }

        xml.WriteElementString("system-out", ReportText.Headline(claim));
        xml.WriteEndElement();
    }

    /// <summary>What decided the answer and the claim's contradictions, as plain lines under a failure.</summary>
    private static string Details(ClaimReport claim)
    {
        var text = new StringBuilder();
        foreach (var clause in claim.Deciding.Take(4))
        {
            text.Append("decided by ").Append(ReportText.Clause(clause, claim)).Append('\n');
        }

        foreach (var conflict in claim.Conflicts)
        {
            text.Append("conflicting readings ").Append(ReportText.Conflict(conflict)).Append('\n');
        }

        foreach (var pair in claim.Pairs.Where(p => p.Linked && p.IsContradiction))
        {
            text.Append("contradiction ").Append(ReportText.Pair(pair)).Append('\n');
        }

        foreach (var statement in claim.Statements.Where(s => s.Kept))
        {
            text.Append(Invariant, $"#{statement.Id} {ReportText.Value(statement.Value)} belief {ReportText.Belief(statement.Belief)}: {ReportText.OneLine(statement.Text)}\n");
        }

        return text.ToString();
    }

    private void Properties(XmlWriter xml, RunReport report)
    {
        var settings = report.Header.Settings;
        xml.WriteStartElement("properties");
        void Property(string name, string value)
        {
            xml.WriteStartElement("property");
            xml.WriteAttributeString("name", name);
            xml.WriteAttributeString("value", value);
            xml.WriteEndElement();
        }

        Property("plumbline_version", report.Header.ToolVersion);
        Property("model_source", settings.ModelSource);
        Property("nli_model", settings.NliModel);
        Property("contested_margin", ReportText.Weight(settings.ContestedThreshold));
        Property("junit_fail_on", failures.ToString().ToLowerInvariant());
        Property("notice", ReportNotice.Text);
        xml.WriteEndElement();
    }

    private static string Summary(RunReport report)
    {
        var figures = report.Figures;
        var text = new StringBuilder();
        text.Append(Invariant, $"{figures.Claims} claims: {figures.Settled} settled, {figures.Overturned} overturned, {figures.Contested} contested, {figures.Failed} failed\n");
        if (figures.CoherentAccuracy is { } coherent && figures.DirectAccuracy is { } direct)
        {
            text.Append("direct accuracy ").Append(ReportText.Accuracy(direct)).Append('\n');
            text.Append("coherent accuracy ").Append(ReportText.Accuracy(coherent)).Append('\n');
        }

        text.Append(Invariant, $"mean margin {ReportText.Weight(figures.MeanMargin)} (normalised {ReportText.Weight(figures.MeanNormalisedMargin)})")
            .Append(figures.MeanStability is { } stability ? $", mean stability {ReportText.Percent(stability)}" : "")
            .Append(Invariant, $", conflicting pairs {figures.ConflictingPairs}, cut-off explanations {figures.CutOffDiscarded}\n");
        if (report.Completion.StoppedBecause is { } reason)
        {
            text.Append("stopped: ").Append(reason).Append('\n');
        }

        return text.ToString();
    }

    private static string Safe(string tag) => new([.. tag.Select(c => char.IsLetterOrDigit(c) || c is '-' or '_' ? c : '_')]);

    private static string Count(int n) => n.ToString(Invariant);

    private static string Seconds(TimeSpan span) => span.TotalSeconds.ToString("0.000", Invariant);
}
