using System.Globalization;

namespace Plumbline.Nli.Tokenization;

/// <summary>
/// Code points unassigned in the Unicode version of the reference tokenizer (unassigned.txt, see
/// make_unicode_tables.py). They are dropped like control characters even where the runtime's newer Unicode
/// data assigns them, so both tokenizers see the same text.
/// </summary>
internal static class UnassignedCodePoints
{
    private static readonly (int First, int Last)[] Ranges = Load();

    public static bool Contains(int codePoint)
    {
        int low = 0, high = Ranges.Length - 1;
        while (low <= high)
        {
            var middle = (low + high) / 2;
            if (codePoint < Ranges[middle].First)
            {
                high = middle - 1;
            }
            else if (codePoint > Ranges[middle].Last)
            {
                low = middle + 1;
            }
            else
            {
                return true;
            }
        }

        return false;
    }

    private static (int First, int Last)[] Load()
    {
        var ranges = new List<(int, int)>();
        foreach (var line in EmbeddedTable.Lines("unassigned.txt"))
        {
            var tab = line.IndexOf('\t', StringComparison.Ordinal);
            ranges.Add((
                int.Parse(line.AsSpan(0, tab), NumberStyles.HexNumber, CultureInfo.InvariantCulture),
                int.Parse(line.AsSpan(tab + 1), NumberStyles.HexNumber, CultureInfo.InvariantCulture)));
        }

        return [.. ranges];
    }
}
