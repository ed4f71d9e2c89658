using System.Globalization;
using System.Text;
using Plumbline.Core.Entailment;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Html;

/// <summary>
/// Draws one claim's tree as inline SVG: statements as boxes in rows by depth (leaves spread left to right, a parent
/// centred over its children), parent-child lines in grey, and each link as a curve between its two statements:
/// entailment solid with an arrow, contradiction dashed. A box is filled by the statement's value in the optimum,
/// greyed when pruned, and its full text is in its tooltip.
/// </summary>
internal static class TreeSvg
{
    private const int BoxWidth = 210;
    private const int BoxHeight = 58;
    private const int ColumnGap = 26;
    private const int RowGap = 64;
    private const int Margin = 14;

    /// <summary>Characters of statement text per line inside a box; two lines are shown.</summary>
    private const int LineLength = 32;

    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    public static string Draw(ClaimReport claim)
    {
        if (claim.Statements.Count == 0)
        {
            return "<p class=\"no-tree\">No tree: the claim failed before one was built.</p>\n";
        }

        var positions = Layout(claim);
        var width = (int)positions.Values.Max(p => p.X) + BoxWidth + 2 * Margin;
        var height = (int)positions.Values.Max(p => p.Y) + BoxHeight + 2 * Margin;
        var svg = new StringBuilder();
        svg.Append(Invariant, $"<svg class=\"tree\" role=\"img\" viewBox=\"0 0 {width} {height}\" width=\"{width}\" height=\"{height}\" xmlns=\"http://www.w3.org/2000/svg\">\n")
            .Append(Invariant, $"<title>Explanation tree of claim {HtmlReportWriter.E(claim.Id)}</title>\n");

        foreach (var statement in claim.Statements.Where(s => s.Parent is { } parent && positions.ContainsKey(parent)))
        {
            var (from, to) = (positions[statement.Parent!.Value], positions[statement.Id]);
            svg.Append(Invariant, $"<line class=\"edge\" x1=\"{from.X + BoxWidth / 2.0}\" y1=\"{from.Y + BoxHeight}\" x2=\"{to.X + BoxWidth / 2.0}\" y2=\"{to.Y}\"/>\n");
        }

        foreach (var link in claim.Links.Where(l => positions.ContainsKey(l.From) && positions.ContainsKey(l.To)))
        {
            var (from, to) = (Centre(positions[link.From]), Centre(positions[link.To]));
            // Bend each direction to its own side, so the two directions of one pair stay apart.
            var (dx, dy) = (to.X - from.X, to.Y - from.Y);
            var length = Math.Max(1, Math.Sqrt(dx * dx + dy * dy));
            var bend = (link.From < link.To ? 1 : -1) * Math.Min(90, 24 + length / 4);
            var (cx, cy) = ((from.X + to.X) / 2 - dy / length * bend, (from.Y + to.Y) / 2 + dx / length * bend);
            var kind = link.Kind == EntailmentKind.Contradiction ? "contradiction" : "entailment";
            svg.Append(Invariant, $"<path class=\"link {kind}\" d=\"M{from.X:0.#},{from.Y:0.#} Q{cx:0.#},{cy:0.#} {to.X:0.#},{to.Y:0.#}\"")
                .Append(kind == "entailment" ? " marker-end=\"url(#arrow)\"" : "")
                .Append(Invariant, $"><title>#{link.From} {(kind == "entailment" ? "entails" : "contradicts")} #{link.To} (p {ReportText.Probability(link.Probability)})</title></path>\n");
        }

        foreach (var statement in claim.Statements)
        {
            var at = positions[statement.Id];
            var fill = !statement.Kept ? "pruned" : statement.Value switch { true => "held-true", false => "held-false", null => "unknown" };
            svg.Append(Invariant, $"<g class=\"node {fill}\" data-statement=\"{statement.Id}\" transform=\"translate({at.X:0.#},{at.Y:0.#})\">")
                .Append(Invariant, $"<title>#{statement.Id}: {HtmlReportWriter.E(ReportText.OneLine(statement.Text))}</title>")
                .Append(Invariant, $"<rect width=\"{BoxWidth}\" height=\"{BoxHeight}\" rx=\"9\"/>")
                .Append(Invariant, $"<text x=\"10\" y=\"17\" class=\"head\">#{statement.Id} {Value(statement)} &#183; belief {ReportText.Belief(statement.Belief)}{For(statement)}</text>");
            var lines = Wrap(ReportText.OneLine(statement.Text));
            for (var i = 0; i < lines.Count; i++)
            {
                svg.Append(Invariant, $"<text x=\"10\" y=\"{35 + 15 * i}\">{HtmlReportWriter.E(lines[i])}</text>");
            }

            svg.Append("</g>\n");
        }

        svg.Append("</svg>\n");
        return svg.ToString();
    }

    /// <summary>Top-left corner of every statement's box: leaves in depth-first order, parents centred over their children.</summary>
    private static Dictionary<int, (double X, double Y)> Layout(ClaimReport claim)
    {
        var children = claim.Statements.Where(s => s.Parent is not null).ToLookup(s => s.Parent!.Value, s => s.Id);
        var depthOf = claim.Statements.ToDictionary(s => s.Id, s => s.Depth);
        var positions = new Dictionary<int, (double X, double Y)>();
        var nextLeaf = 0;

        double Place(int id)
        {
            var kids = children[id].ToList();
            var x = kids.Count == 0 ? nextLeaf++ * (double)(BoxWidth + ColumnGap) : kids.Select(Place).Average();
            positions[id] = (x + Margin, depthOf[id] * (BoxHeight + RowGap) + Margin);
            return x;
        }

        foreach (var root in claim.Statements.Where(s => s.Parent is null || !depthOf.ContainsKey(s.Parent.Value)))
        {
            Place(root.Id);
        }

        return positions;
    }

    private static (double X, double Y) Centre((double X, double Y) corner) => (corner.X + BoxWidth / 2.0, corner.Y + BoxHeight / 2.0);

    private static string Value(StatementReport statement) => !statement.Kept ? "pruned" : statement.Value switch
    {
        true => "true",
        false => "false",
        null => "no value",
    };

    private static string For(StatementReport statement) => statement.GeneratedFor switch
    {
        true => " &#183; for true",
        false => " &#183; for false",
        null => "",
    };

    /// <summary>The text in at most two lines of <see cref="LineLength"/> characters, broken at spaces, the rest elided.</summary>
    private static List<string> Wrap(string text)
    {
        var lines = new List<string>();
        var rest = text;
        while (rest.Length > 0 && lines.Count < 2)
        {
            if (rest.Length <= LineLength)
            {
                lines.Add(rest);
                break;
            }

            var cut = rest.LastIndexOf(' ', LineLength);
            cut = cut <= 0 ? LineLength : cut;
            var line = rest[..cut].TrimEnd();
            rest = rest[cut..].TrimStart();
            lines.Add(lines.Count == 1 && rest.Length > 0 ? ReportText.Shorten(line + " " + rest, LineLength) : line);
        }

        return lines;
    }
}
