using System.Text.Json;
using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Evaluation;

/// <summary>
/// Reads labelled sentence pairs for evaluation from CSV (quoted, with a header row), TSV (header row, no quoting)
/// or JSON Lines (one object per line), chosen by file extension. Field names: see <see cref="PairColumns"/>.
/// Rows labelled "-" are skipped and counted; any other bad row stops the read with file, line and field.
/// </summary>
public static class LabelledPairReader
{
    public static LabelledPairSet Read(string path)
    {
        var extension = Path.GetExtension(path).ToLowerInvariant();
        if (extension is not (".csv" or ".tsv" or ".jsonl" or ".ndjson"))
        {
            throw new LabelledPairFormatException(path, 1, "file name", $"unknown file type '{extension}'; expected .csv, .tsv or .jsonl");
        }

        var text = File.ReadAllText(path);
        return extension switch
        {
            ".csv" => FromRecords(path, header => DelimitedRecords.Csv(text, path, index => header() is { } names && index < names.Count ? names[index] : $"field {index + 1}")),
            ".tsv" => FromRecords(path, _ => DelimitedRecords.Tsv(text)),
            _ => FromJsonLines(path, text),
        };
    }

    private static LabelledPairSet FromRecords(string file, Func<Func<IReadOnlyList<string>?>, IEnumerable<DelimitedRecords.Record>> records)
    {
        IReadOnlyList<string>? header = null;
        PairColumns? columns = null;
        int premise = 0, hypothesis = 0, label = 0;
        var pairs = new List<LabelledPair>();
        var skipped = 0;
        foreach (var record in records(() => header))
        {
            if (columns is null)
            {
                header = record.Fields.Select(name => name.Trim()).ToArray();
                columns = PairColumns.Require(header, file);
                premise = IndexOf(header, columns.Premise);
                hypothesis = IndexOf(header, columns.Hypothesis);
                label = IndexOf(header, columns.Label);
                continue;
            }

            string Field(int index, string name) => index < record.Fields.Count
                ? record.Fields[index]
                : throw new LabelledPairFormatException(file, record.Line, name, $"missing: row has {record.Fields.Count} fields, header has {header!.Count}");

            var gold = GoldLabels.Parse(Field(label, columns.Label), file, record.Line, columns.Label);
            var pair = new SentencePair(Field(premise, columns.Premise), Field(hypothesis, columns.Hypothesis));
            if (gold is { } kind)
            {
                pairs.Add(new LabelledPair(pair, kind, record.Line));
            }
            else
            {
                skipped++;
            }
        }

        if (columns is null)
        {
            throw new LabelledPairFormatException(file, 1, "header", "file is empty");
        }

        return new LabelledPairSet(file, pairs, skipped);
    }

    private static LabelledPairSet FromJsonLines(string file, string text)
    {
        var pairs = new List<LabelledPair>();
        var skipped = 0;
        var lines = text.Split('\n');
        for (var index = 0; index < lines.Length; index++)
        {
            var line = index + 1;
            if (string.IsNullOrWhiteSpace(lines[index]))
            {
                continue;
            }

            using var document = Parse(lines[index], file, line);
            var row = document.RootElement;
            var (premise, hypothesis, label) = PairColumns.Find(row.EnumerateObject().Select(property => property.Name));
            var gold = GoldLabels.Parse(LabelText(row, label ?? throw Missing(file, line, "label", "gold_label or label"), file, line), file, line, label);
            var pair = new SentencePair(
                Text(row, premise ?? throw Missing(file, line, "premise", "premise or sentence1"), file, line),
                Text(row, hypothesis ?? throw Missing(file, line, "hypothesis", "hypothesis or sentence2"), file, line));
            if (gold is { } kind)
            {
                pairs.Add(new LabelledPair(pair, kind, line));
            }
            else
            {
                skipped++;
            }
        }

        return new LabelledPairSet(file, pairs, skipped);
    }

    private static JsonDocument Parse(string line, string file, int lineNumber)
    {
        try
        {
            var document = JsonDocument.Parse(line);
            if (document.RootElement.ValueKind == JsonValueKind.Object)
            {
                return document;
            }

            document.Dispose();
            throw new LabelledPairFormatException(file, lineNumber, "row", "expected a JSON object");
        }
        catch (JsonException e)
        {
            throw new LabelledPairFormatException(file, lineNumber, "row", $"not valid JSON: {e.Message.Split('\n')[0].Trim()}", e);
        }
    }

    private static string Text(JsonElement row, string name, string file, int line)
    {
        var value = row.GetProperty(name);
        return value.ValueKind == JsonValueKind.String
            ? value.GetString()!
            : throw new LabelledPairFormatException(file, line, name, $"must be a string, not {value.ValueKind.ToString().ToLowerInvariant()}");
    }

    private static string LabelText(JsonElement row, string name, string file, int line)
    {
        var value = row.GetProperty(name);
        return value.ValueKind switch
        {
            JsonValueKind.String => value.GetString()!,
            JsonValueKind.Number when value.TryGetInt32(out var index) => index.ToString(System.Globalization.CultureInfo.InvariantCulture),
            _ => throw new LabelledPairFormatException(file, line, name, "must be a label name or 0, 1, 2"),
        };
    }

    private static LabelledPairFormatException Missing(string file, int line, string role, string names) =>
        new(file, line, role, $"no {names} field");

    private static int IndexOf(IReadOnlyList<string> header, string name) =>
        header.Select((field, index) => (field, index)).First(item => item.field == name).index;
}
