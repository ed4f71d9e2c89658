using System.CommandLine;
using System.Globalization;
using Plumbline.Core.Trees;

namespace Plumbline.Cli.Options;

/// <summary>
/// <c>--tree-widths W1,W2,...</c>: explanations per answer at each depth; the number of widths is the tree's depth.
/// Each depth keeps the default tree's decoding for it (sampled at depth 1, greedy below), since deeper explanations
/// only need to settle their parent.
/// </summary>
internal static class TreeShapeOption
{
    public const int MaxDepth = 4;

    public const int MaxWidth = 8;

    public static Option<TreeShape?> Create()
    {
        var option = new Option<TreeShape?>("--tree-widths")
        {
            Description = $"Explanations per answer at each depth, comma-separated (default {Describe(TreeShape.Default)}); " +
                          $"the count is the tree's depth (1 to {MaxDepth}), each width 1 to {MaxWidth}.",
            HelpName = "W1,W2",
        };
        option.CustomParser = result =>
        {
            var text = result.Tokens.Count > 0 ? result.Tokens[^1].Value : "";
            var parts = text.Split(',', StringSplitOptions.TrimEntries);
            var widths = parts.Select(p => int.TryParse(p, NumberStyles.None, CultureInfo.InvariantCulture, out var w) ? w : 0).ToArray();
            if (parts.Length is < 1 or > MaxDepth || widths.Any(w => w is < 1 or > MaxWidth))
            {
                result.AddError($"--tree-widths: '{text}' is not 1 to {MaxDepth} widths from 1 to {MaxWidth}, comma-separated (for example 3,1)");
                return null;
            }

            return Of(widths);
        };
        return option;
    }

    /// <summary>The shape with these widths, each depth decoded as the default tree decodes it (its last level for deeper ones).</summary>
    public static TreeShape Of(IReadOnlyList<int> widths)
    {
        var defaults = TreeShape.Default.Levels;
        return new TreeShape([.. widths.Select((w, i) => new LevelShape(w, defaults[Math.Min(i, defaults.Count - 1)].Decoding))]);
    }

    public static string Describe(TreeShape shape) => string.Join(',', shape.Levels.Select(l => l.Width.ToString(CultureInfo.InvariantCulture)));
}
