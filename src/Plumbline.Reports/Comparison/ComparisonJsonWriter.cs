using System.Text.Json;
using Plumbline.Reports.Json;

namespace Plumbline.Reports.Comparison;

/// <summary>
/// The comparison as one JSON object ("comparison_version" 1): both runs, warnings, the changed claims, the figures
/// old and new, the paired tests and the gate. Shares and margins keep four decimals like the run report; p-values
/// are written unrounded, since a gate may sit far below 0.0001.
/// </summary>
internal sealed class ComparisonJsonWriter : IComparisonWriter
{
    public string Format => "json";

    public async Task WriteAsync(ComparisonReport comparison, Stream output, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(comparison);
        await using (var json = new Utf8JsonWriter(output, JsonReportWriter.Options))
        {
            json.WriteStartObject();
            json.WriteNumber("comparison_version", ComparisonReport.JsonVersion);
            json.WriteString("notice", ReportNotice.Text);
            Run(json, "old", comparison.OldFile, comparison.Old);
            Run(json, "new", comparison.NewFile, comparison.New);
            json.WriteStartArray("warnings");
            comparison.Warnings.ToList().ForEach(json.WriteStringValue);
            json.WriteEndArray();
            json.WriteStartArray("settings_changed");
            foreach (var difference in comparison.SettingsChanged)
            {
                json.WriteStartObject();
                json.WriteString("key", difference.Key);
                ReportJson.WriteNullable(json, "old", difference.First);
                ReportJson.WriteNullable(json, "new", difference.Second);
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteBoolean("inputs_differ", comparison.InputsDiffer);
            json.WriteNumber("paired", comparison.Paired);
            Strings(json, "only_old", comparison.OnlyOld);
            Strings(json, "only_new", comparison.OnlyNew);
            json.WriteStartArray("changes");
            foreach (var change in comparison.Changes)
            {
                json.WriteStartObject();
                json.WriteString("id", change.Id);
                json.WriteString("claim", change.Text);
                ReportJson.WriteNullable(json, "old_answer", change.OldAnswer);
                ReportJson.WriteNullable(json, "new_answer", change.NewAnswer);
                json.WriteString("old_status", ReportWords.Of(change.OldStatus));
                json.WriteString("new_status", ReportWords.Of(change.NewStatus));
                ReportJson.WriteNullable(json, "old_agrees_with_gold", change.OldAgrees);
                ReportJson.WriteNullable(json, "new_agrees_with_gold", change.NewAgrees);
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteStartObject("figures");
            foreach (var figure in comparison.Figures)
            {
                json.WriteStartObject(figure.Name);
                ReportJson.WriteNullable(json, "old", figure.Old, "old");
                ReportJson.WriteNullable(json, "new", figure.New, "new");
                ReportJson.WriteNullable(json, "change", figure.Change, "change");
                json.WriteEndObject();
            }

            json.WriteEndObject();
            Test(json, "correctness", comparison.Correctness);
            Test(json, "answers", comparison.Answers);
            if (comparison.Gate is { } gate)
            {
                json.WriteStartObject("gate");
                json.WriteString("name", RegressionGate.Name);
                json.WriteNumber("alpha", gate.Alpha);
                if (gate.PValue is { } p)
                {
                    json.WriteNumber("p_value", p);
                }
                else
                {
                    json.WriteNull("p_value");
                }

                json.WriteBoolean("passed", gate.Passed);
                json.WriteString("reason", gate.Reason);
                json.WriteEndObject();
            }
            else
            {
                json.WriteNull("gate");
            }

            json.WriteEndObject();
        }

        await output.WriteAsync("\n"u8.ToArray(), cancellationToken);
        await output.FlushAsync(cancellationToken);
    }

    private static void Run(Utf8JsonWriter json, string name, string file, Model.RunHeader header)
    {
        json.WriteStartObject(name);
        json.WriteString("file", file);
        json.WriteString("plumbline_version", header.ToolVersion);
        json.WriteString("started", ReportNumbers.Instant(header.Started));
        ReportJson.WriteNullable(json, "input_digest", header.Input?.Digest);
        json.WriteEndObject();
    }

    private static void Test(Utf8JsonWriter json, string name, PairedTest? test)
    {
        if (test is null)
        {
            json.WriteNull(name);
            return;
        }

        json.WriteStartObject(name);
        json.WriteString("outcome", test.Outcome);
        json.WriteNumber("pairs", test.Pairs);
        json.WriteNumber("old_only", test.Test.FirstOnly);
        json.WriteNumber("new_only", test.Test.SecondOnly);
        json.WriteNumber("p_value", test.Test.PValue);
        json.WriteEndObject();
    }

    private static void Strings(Utf8JsonWriter json, string name, IReadOnlyList<string> values)
    {
        json.WriteStartArray(name);
        foreach (var value in values)
        {
            json.WriteStringValue(value);
        }

        json.WriteEndArray();
    }
}
