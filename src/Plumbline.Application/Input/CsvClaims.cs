using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text;
using Plumbline.Core.Claims;

namespace Plumbline.Application.Input;

/// <summary>
/// Claims as CSV (RFC 4180, common practice): a header naming the columns (<c>claim</c> required; <c>id</c>,
/// <c>gold</c> and <c>tags</c> optional, tags separated by ';'), then one record per claim. Quoted fields may hold
/// commas, doubled quotes and line breaks. A bad header stops the read; a bad record becomes a problem naming the
/// line it starts on and its column, and reading goes on with the next record.
/// </summary>
/// <remarks>
/// Written here rather than taken from a CSV package: what matters is the exact line and column of each
/// problem (an unterminated quote, a stray quote, a short record), which the packages on offer report only loosely.
/// </remarks>
internal static class CsvClaims
{
    private static readonly string[] KnownColumns = ["id", "claim", "gold", "tags"];

    public static async IAsyncEnumerable<ClaimLine> ReadAsync(
        TextReader reader,
        string source,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        var records = new CsvRecords(reader, source);
        string[]? header = null;
        while (await records.NextAsync(cancellationToken) is { } record)
        {
            if (header is null)
            {
                // A header that cannot be read makes every record unreadable: the input as a whole is wrong.
                header = record.Problem is { } broken ? throw Located(record, broken, null) : Header(record, source);
                continue;
            }

            yield return record.Problem is { } problem ? ClaimLine.Bad(Located(record, problem, header)) : ToClaim(record, header, source);
        }
    }

    /// <summary>The problem with its column named by the header when there is one.</summary>
    private static ClaimFileException Located(CsvRecord record, string problem, string[]? header)
    {
        var column = record.Column is { } index
            ? header is not null && index < header.Length ? header[index] : string.Create(CultureInfo.InvariantCulture, $"column {index + 1}")
            : null;
        return new ClaimFileException(record.Source, record.Line, column, problem);
    }

    private static string[] Header(CsvRecord record, string source)
    {
        var columns = record.Fields.Select(f => f.Trim().ToLowerInvariant()).ToArray();
        for (var i = 0; i < columns.Length; i++)
        {
            if (!KnownColumns.Contains(columns[i]))
            {
                throw new ClaimFileException(source, record.Line, record.Fields[i].Trim(),
                    $"unknown column in the header (known: {string.Join(", ", KnownColumns)})");
            }

            if (Array.IndexOf(columns, columns[i]) != i)
            {
                throw new ClaimFileException(source, record.Line, columns[i], "column named twice in the header");
            }
        }

        return columns.Contains("claim")
            ? columns
            : throw new ClaimFileException(source, record.Line, null, "the header has no 'claim' column (columns: id, claim, gold, tags)");
    }

    private static ClaimLine ToClaim(CsvRecord record, string[] header, string source)
    {
        ClaimLine Bad(string? field, string problem) => ClaimLine.Bad(new ClaimFileException(source, record.Line, field, problem));

        if (record.Fields.Count != header.Length)
        {
            return Bad(null, string.Create(CultureInfo.InvariantCulture,
                $"expected {header.Length} fields ({string.Join(", ", header)}), found {record.Fields.Count}"));
        }

        string? id = null, text = null;
        bool? gold = null;
        List<string>? tags = null;
        for (var i = 0; i < header.Length; i++)
        {
            var value = record.Fields[i].Trim();
            switch (header[i])
            {
                case "id":
                    id = value.Length == 0 ? null : value;
                    break;
                case "claim":
                    if (value.Length == 0)
                    {
                        return Bad("claim", "missing or empty");
                    }

                    text = value;
                    break;
                case "gold":
                    if (!GoldLabels.TryParse(value, out gold))
                    {
                        return Bad("gold", GoldLabels.Unknown(value));
                    }

                    break;
                default:
                    tags = [.. value.Split(';', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries)];
                    break;
            }
        }

        return ClaimLine.Good(record.Line, new Claim(id ?? JsonLinesClaims.LineId(record.Line), text!, gold, tags));
    }

    /// <summary>One CSV record: its fields, or the problem that makes it unreadable (and in which column), and the line it starts on.</summary>
    private sealed record CsvRecord(string Source, int Line, IReadOnlyList<string> Fields, string? Problem = null, int? Column = null);

    /// <summary>Splits a text into records, line by line, carrying quoted fields across line breaks.</summary>
    private sealed class CsvRecords(TextReader reader, string source)
    {
        private int lineNumber;

        public async Task<CsvRecord?> NextAsync(CancellationToken cancellationToken)
        {
            string? line;
            do
            {
                line = await reader.ReadLineAsync(cancellationToken);
                if (line is null)
                {
                    return null;
                }

                lineNumber++;
            }
            while (string.IsNullOrWhiteSpace(line));

            var start = lineNumber;
            var fields = new List<string>();
            var field = new StringBuilder();
            var length = 0;
            var (quoted, fieldStart) = (false, true);
            while (true)
            {
                length += line.Length;
                if (length > InputLimits.MaxLineCharacters)
                {
                    // Skip the rest of an oversized record: to its line end, or past its quoted part.
                    return await SkipAsync(start, quoted, length, cancellationToken);
                }

                for (var i = 0; i < line.Length; i++)
                {
                    var c = line[i];
                    if (quoted)
                    {
                        if (c != '"')
                        {
                            field.Append(c);
                        }
                        else if (i + 1 < line.Length && line[i + 1] == '"')
                        {
                            field.Append('"');
                            i++;
                        }
                        else if (i + 1 < line.Length && line[i + 1] != ',')
                        {
                            return Problem(start, fields.Count, "text after the closing quote of a quoted field");
                        }
                        else
                        {
                            quoted = false;
                        }
                    }
                    else if (c == ',')
                    {
                        fields.Add(field.ToString());
                        field.Clear();
                        fieldStart = true;
                        continue;
                    }
                    else if (c == '"')
                    {
                        if (!fieldStart || field.ToString().Trim().Length > 0)
                        {
                            return Problem(start, fields.Count, "quote inside an unquoted field (quote the whole field and double the quote)");
                        }

                        field.Clear();
                        quoted = true;
                    }
                    else
                    {
                        field.Append(c);
                    }

                    fieldStart = false;
                }

                if (!quoted)
                {
                    fields.Add(field.ToString());
                    return new CsvRecord(source, start, fields);
                }

                // A line break inside quotes belongs to the field.
                line = await reader.ReadLineAsync(cancellationToken);
                if (line is null)
                {
                    return Problem(start, fields.Count, "unterminated quoted field: its closing quote is missing, so it runs to the end of the input");
                }

                lineNumber++;
                field.Append('\n');
            }
        }

        private async Task<CsvRecord> SkipAsync(int start, bool quoted, int length, CancellationToken cancellationToken)
        {
            while (quoted && await reader.ReadLineAsync(cancellationToken) is { } more)
            {
                lineNumber++;
                length += more.Length;
                quoted = more.Count(c => c == '"') % 2 == 0;
            }

            return new CsvRecord(source, start, [], string.Create(CultureInfo.InvariantCulture,
                $"record is {length} characters long or more; the limit is {InputLimits.MaxLineCharacters}"));
        }

        private CsvRecord Problem(int start, int column, string problem) => new(source, start, [], problem, column);
    }
}
