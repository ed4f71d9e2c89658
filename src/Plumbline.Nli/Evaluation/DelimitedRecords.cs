using System.Text;

namespace Plumbline.Nli.Evaluation;

/// <summary>Splits CSV (RFC 4180 quoting: quoted fields may hold separators, doubled quotes and line breaks) or TSV (no quoting) into records.</summary>
internal static class DelimitedRecords
{
    public sealed record Record(int Line, IReadOnlyList<string> Fields);

    public static IEnumerable<Record> Tsv(string text)
    {
        var line = 0;
        foreach (var row in text.Split('\n'))
        {
            line++;
            var trimmed = row.EndsWith('\r') ? row[..^1] : row;
            if (trimmed.Length > 0)
            {
                yield return new Record(line, trimmed.Split('\t'));
            }
        }
    }

    /// <param name="fieldName">Names a field by index for error messages (the header's names once known).</param>
    public static IEnumerable<Record> Csv(string text, string file, Func<int, string> fieldName)
    {
        var line = 1;
        var at = 0;
        while (at < text.Length)
        {
            var start = line;
            var fields = new List<string>();
            var field = new StringBuilder();
            var quoted = false;
            var inQuotes = false;
            while (true)
            {
                if (at >= text.Length)
                {
                    if (inQuotes)
                    {
                        throw new LabelledPairFormatException(file, start, fieldName(fields.Count), "quoted field is never closed");
                    }

                    break;
                }

                var c = text[at];
                if (inQuotes)
                {
                    if (c == '"' && at + 1 < text.Length && text[at + 1] == '"')
                    {
                        field.Append('"');
                        at += 2;
                        continue;
                    }

                    if (c == '"')
                    {
                        inQuotes = false;
                    }
                    else
                    {
                        line += c == '\n' ? 1 : 0;
                        field.Append(c);
                    }

                    at++;
                    continue;
                }

                if (c == ',')
                {
                    fields.Add(field.ToString());
                    field.Clear();
                    quoted = false;
                    at++;
                }
                else if (c == '\n' || (c == '\r' && at + 1 < text.Length && text[at + 1] == '\n'))
                {
                    at += c == '\r' ? 2 : 1;
                    line++;
                    break;
                }
                else if (quoted)
                {
                    throw new LabelledPairFormatException(file, start, fieldName(fields.Count), "text after the closing quote");
                }
                else if (c == '"' && field.Length == 0)
                {
                    quoted = true;
                    inQuotes = true;
                    at++;
                }
                else
                {
                    field.Append(c);
                    at++;
                }
            }

            fields.Add(field.ToString());
            if (fields.Count > 1 || fields[0].Length > 0 || quoted)
            {
                yield return new Record(start, fields);
            }
        }
    }
}
