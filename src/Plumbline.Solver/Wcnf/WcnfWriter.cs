using System.Globalization;
using System.Text;
using Plumbline.Core.MaxSat;

namespace Plumbline.Solver.Wcnf;

/// <summary>Writes a problem in the 2022 WCNF form: comment lines, then <c>h ... 0</c> for hard and <c>w ... 0</c> for soft clauses.</summary>
public static class WcnfWriter
{
    private static readonly System.Buffers.SearchValues<char> LineBreaks =
        System.Buffers.SearchValues.Create("\r\n\v\f\u0085\u2028\u2029");

    /// <summary>Writes <paramref name="problem"/> after one <c>c</c> line per comment.</summary>
    /// <remarks>
    /// Line breaks inside a comment become spaces so the text stays one comment line. Soft clauses of weight 0 are
    /// left out: they never change a cost and the format requires weights of at least 1.
    /// </remarks>
    /// <exception cref="ArgumentException">The problem is malformed (literal out of range, negative weight, weight overflow).</exception>
    public static void Write(MaxSatProblem problem, IEnumerable<string> comments, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(comments);
        ArgumentNullException.ThrowIfNull(writer);
        ProblemChecks.SoftWeightSum(problem, long.MaxValue, "the most the format allows");

        foreach (var comment in comments)
        {
            var text = OneLine(comment ?? string.Empty);
            writer.Write(text.Length == 0 ? "c\n" : $"c {text}\n");
        }

        var line = new StringBuilder();
        foreach (var clause in problem.Clauses)
        {
            if (!clause.IsHard && clause.Weight == 0)
            {
                continue;
            }

            line.Clear();
            line.Append(clause.IsHard ? "h" : clause.Weight.ToString(CultureInfo.InvariantCulture));
            foreach (var literal in clause.Literals)
            {
                line.Append(' ').Append(literal.ToString(CultureInfo.InvariantCulture));
            }

            line.Append(" 0\n");
            writer.Write(line);
        }
    }

    /// <inheritdoc cref="Write"/>
    public static async Task WriteFileAsync(
        string path,
        MaxSatProblem problem,
        IEnumerable<string> comments,
        CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(path);
        using var text = new StringWriter(CultureInfo.InvariantCulture);
        Write(problem, comments, text);
        await File.WriteAllTextAsync(path, text.ToString(), cancellationToken).ConfigureAwait(false);
    }

    /// <summary>Replaces every character a reader might take as a line end (CR, LF, VT, FF, NEL, LS, PS) with a space.</summary>
    internal static string OneLine(string text)
    {
        if (text.AsSpan().IndexOfAny(LineBreaks) < 0)
        {
            return text;
        }

        return text.Replace("\r\n", " ", StringComparison.Ordinal)
            .Replace('\r', ' ').Replace('\n', ' ').Replace('\v', ' ').Replace('\f', ' ')
            .Replace('\u0085', ' ').Replace('\u2028', ' ').Replace('\u2029', ' ');
    }
}
