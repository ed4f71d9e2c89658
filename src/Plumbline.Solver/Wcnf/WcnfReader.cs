using System.Globalization;
using Plumbline.Core.MaxSat;

namespace Plumbline.Solver.Wcnf;

/// <summary>
/// Reads weighted DIMACS (WCNF) in both generations: with a <c>p wcnf</c>/<c>p cnf</c> header (weight >= top is
/// hard) and the header-less 2022 form (<c>h</c> marks hard clauses). Clauses end at the token 0, not at the end of
/// a line; comment lines may appear anywhere.
/// </summary>
public static class WcnfReader
{
    /// <exception cref="WcnfFormatException">The file breaks the format; the message names file, line and field.</exception>
    /// <exception cref="IOException">The file cannot be read.</exception>
    public static async Task<WcnfInstance> ReadFileAsync(string path, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(path);
        var text = await File.ReadAllTextAsync(path, cancellationToken).ConfigureAwait(false);
        using var reader = new StringReader(text);
        return Read(reader, path);
    }

    /// <param name="reader">The WCNF text.</param>
    /// <param name="source">The name to put in error messages and in <see cref="WcnfInstance.Source"/>.</param>
    /// <exception cref="WcnfFormatException">The text breaks the format.</exception>
    public static WcnfInstance Read(TextReader reader, string source)
    {
        ArgumentNullException.ThrowIfNull(reader);
        ArgumentNullException.ThrowIfNull(source);
        return new Parser(source).Run(reader);
    }

    private sealed class Parser(string source)
    {
        private readonly List<WeightedClause> clauses = [];
        private readonly List<string> comments = [];
        private readonly List<int> literals = [];
        private Header? header;
        private int lineNumber;
        private int maxVariable;
        private long softWeightSum;

        // State of the clause being read; a clause is open from its weight (or first literal) to its 0.
        private bool clauseOpen;
        private bool clauseHard;
        private long clauseWeight;
        private int clauseStartLine;

        public WcnfInstance Run(TextReader reader)
        {
            while (reader.ReadLine() is { } line)
            {
                lineNumber++;
                var text = line.AsSpan().TrimStart();
                if (text.IsEmpty)
                {
                    continue;
                }

                if (text[0] == 'c')
                {
                    comments.Add(CommentText(text[1..]));
                }
                else if (text[0] == 'p')
                {
                    ReadHeader(text.ToString());
                }
                else
                {
                    foreach (var token in text.ToString().Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries))
                    {
                        ReadToken(token);
                    }
                }
            }

            if (clauseOpen)
            {
                throw Error(
                    "clause",
                    $"missing terminating 0 at end of file (the clause starts on line {clauseStartLine})");
            }

            if (header is { } declared && declared.ClauseCount != clauses.Count)
            {
                throw new WcnfFormatException(
                    source,
                    declared.Line,
                    "header nbclauses",
                    $"header declares {declared.ClauseCount} clauses but the file has {clauses.Count}");
            }

            var format = header?.Format ?? WcnfFormat.Since2022;
            var variableCount = header?.VariableCount ?? maxVariable;
            return new WcnfInstance(
                source,
                new MaxSatProblem(variableCount, clauses.ToArray()),
                format,
                header?.Top,
                comments.ToArray());
        }

        private static string CommentText(ReadOnlySpan<char> afterMarker) =>
            (afterMarker.StartsWith(" ") ? afterMarker[1..] : afterMarker).TrimEnd().ToString();

        private void ReadHeader(string line)
        {
            if (header is not null)
            {
                throw Error("header", $"second p line (the first is on line {header.Line})");
            }

            if (clauses.Count > 0 || clauseOpen)
            {
                throw Error("header", "p line after the first clause; it must come before every clause");
            }

            var fields = line.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
            if (fields[0] != "p")
            {
                throw Error("header", $"'{fields[0]}' is not 'p'; a header reads 'p wcnf nbvar nbclauses [top]'");
            }

            var format = Field(fields, 1, "header format") switch
            {
                "wcnf" => WcnfFormat.Pre2022Weighted,
                "cnf" => WcnfFormat.Pre2022Unweighted,
                var other => throw Error("header format", $"'{other}' is neither 'wcnf' nor 'cnf'"),
            };
            var variableCount = ParseCount(Field(fields, 2, "header nbvar"), "header nbvar");
            var clauseCount = ParseCount(Field(fields, 3, "header nbclauses"), "header nbclauses");
            long? top = null;
            var used = 4;
            if (format == WcnfFormat.Pre2022Weighted && fields.Length > 4)
            {
                top = ParsePositive(fields[4], "header top");
                used = 5;
            }

            if (fields.Length > used)
            {
                throw Error("header", $"unexpected extra field '{fields[used]}'");
            }

            header = new Header(format, variableCount, clauseCount, top, lineNumber);
        }

        private string Field(string[] fields, int index, string name) =>
            index < fields.Length ? fields[index] : throw Error(name, "missing");

        private int ParseCount(string token, string field) =>
            int.TryParse(token, NumberStyles.None, CultureInfo.InvariantCulture, out var value)
                ? value
                : throw Error(field, $"'{token}' is not a non-negative integer");

        private long ParsePositive(string token, string field) =>
            long.TryParse(token, NumberStyles.None, CultureInfo.InvariantCulture, out var value) && value >= 1
                ? value
                : throw Error(field, $"'{token}' is not a positive integer");

        private void ReadToken(string token)
        {
            if (!clauseOpen)
            {
                OpenClause(token);
                if (header?.Format != WcnfFormat.Pre2022Unweighted)
                {
                    return;
                }
            }

            if (!int.TryParse(token, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var literal)
                || literal == int.MinValue)
            {
                throw Error("literal", $"'{token}' is not an integer");
            }

            if (literal == 0)
            {
                CloseClause();
                return;
            }

            var variable = Math.Abs(literal);
            if (header is { } declared && variable > declared.VariableCount)
            {
                throw Error(
                    "literal",
                    $"{literal} is out of range (header declares {declared.VariableCount} variables)");
            }

            maxVariable = Math.Max(maxVariable, variable);
            literals.Add(literal);
        }

        private void OpenClause(string token)
        {
            clauseOpen = true;
            clauseStartLine = lineNumber;
            literals.Clear();
            switch (header?.Format)
            {
                case WcnfFormat.Pre2022Unweighted:
                    clauseHard = false;
                    clauseWeight = 1;
                    break;
                case WcnfFormat.Pre2022Weighted:
                    if (token == "h")
                    {
                        throw Error(
                            "clause weight",
                            "'h' marks a hard clause only in the 2022 format, and this file has a p line");
                    }

                    clauseWeight = ParsePositive(token, "clause weight");
                    clauseHard = header.Top is { } top && clauseWeight >= top;
                    break;
                default:
                    clauseHard = token == "h";
                    clauseWeight = clauseHard ? 0 : ParsePositive(token, "clause weight");
                    break;
            }
        }

        private void CloseClause()
        {
            clauseOpen = false;
            if (clauseHard)
            {
                clauses.Add(new WeightedClause(literals.ToArray(), 0, IsHard: true));
                return;
            }

            if (clauseWeight > long.MaxValue - softWeightSum)
            {
                throw new WcnfFormatException(
                    source,
                    clauseStartLine,
                    "clause weight",
                    $"the soft weights add up to more than {long.MaxValue}");
            }

            softWeightSum += clauseWeight;
            clauses.Add(new WeightedClause(literals.ToArray(), clauseWeight));
        }

        private WcnfFormatException Error(string field, string problem) =>
            new(source, lineNumber, field, problem);

        private sealed record Header(WcnfFormat Format, int VariableCount, int ClauseCount, long? Top, int Line);
    }
}
