using System.Collections.Frozen;
using System.Globalization;
using System.Text;

namespace Plumbline.Nli.Tokenization;

/// <summary>
/// Lower-casing and accent stripping for uncased WordPiece vocabularies: lower-case, canonical decomposition,
/// non-spacing marks dropped. Runs from a table of the Unicode data (uncased-fold.txt, see make_unicode_tables.py)
/// because invariant-globalization builds have no string normalisation.
/// </summary>
internal static class UncasedFolding
{
    private const int CapitalSigma = 0x3A3;
    private const char FinalSmallSigma = '\u03C2';
    private const int HangulFirst = 0xAC00;
    private const int HangulLast = 0xD7A3;

    private static readonly FrozenDictionary<int, string> Table = Load();

    /// <summary>Folds one whitespace-delimited token; the token is the context for the final-sigma rule.</summary>
    public static string Fold(string token)
    {
        var folded = new StringBuilder(token.Length);
        for (var i = 0; i < token.Length;)
        {
            var rune = Rune.GetRuneAt(token, i);
            if (rune.IsAscii)
            {
                folded.Append(char.ToLowerInvariant((char)rune.Value));
            }
            else if (rune.Value == CapitalSigma && IsFinalSigma(token, i))
            {
                folded.Append(FinalSmallSigma);
            }
            else if (rune.Value is >= HangulFirst and <= HangulLast)
            {
                AppendHangulJamo(folded, rune.Value);
            }
            else if (Table.TryGetValue(rune.Value, out var replacement))
            {
                folded.Append(replacement);
            }
            else
            {
                folded.AppendRune(rune);
            }

            i += rune.Utf16SequenceLength;
        }

        return folded.ToString();
    }

    // A capital sigma ending a word lower-cases to the final form: a cased letter before it, none after it,
    // ignoring marks and apostrophe-like characters in between.
    private static bool IsFinalSigma(string token, int index)
    {
        var before = index - 1;
        while (before >= 0 && IsCaseIgnorable(token[before]))
        {
            before--;
        }

        var after = index + 1;
        while (after < token.Length && IsCaseIgnorable(token[after]))
        {
            after++;
        }

        return before >= 0 && IsCased(token[before]) && !(after < token.Length && IsCased(token[after]));
    }

    private static bool IsCased(char c) =>
        CharUnicodeInfo.GetUnicodeCategory(c) is UnicodeCategory.UppercaseLetter or UnicodeCategory.LowercaseLetter or UnicodeCategory.TitlecaseLetter;

    private static bool IsCaseIgnorable(char c) =>
        c is '\'' or '.' or ':' or '\u00B7' or '\u2018' or '\u2019' or '\u2024' or '\u2027'
        || CharUnicodeInfo.GetUnicodeCategory(c) is UnicodeCategory.NonSpacingMark or UnicodeCategory.EnclosingMark
            or UnicodeCategory.Format or UnicodeCategory.ModifierLetter or UnicodeCategory.ModifierSymbol;

    // Canonical decomposition of a precomposed Hangul syllable into its leading, vowel and optional trailing jamo.
    private static void AppendHangulJamo(StringBuilder target, int syllable)
    {
        const int vowelCount = 21;
        const int trailingCount = 28;
        var index = syllable - HangulFirst;
        target.Append((char)(0x1100 + (index / (vowelCount * trailingCount))));
        target.Append((char)(0x1161 + (index % (vowelCount * trailingCount) / trailingCount)));
        if (index % trailingCount != 0)
        {
            target.Append((char)(0x11A7 + (index % trailingCount)));
        }
    }

    private static FrozenDictionary<int, string> Load()
    {
        var table = new Dictionary<int, string>();
        foreach (var line in EmbeddedTable.Lines("uncased-fold.txt"))
        {
            var tab = line.IndexOf('\t', StringComparison.Ordinal);
            var folded = new StringBuilder();
            foreach (var codePoint in line[(tab + 1)..].Split(' ', StringSplitOptions.RemoveEmptyEntries))
            {
                folded.AppendRune(new Rune(int.Parse(codePoint, NumberStyles.HexNumber, CultureInfo.InvariantCulture)));
            }

            table[int.Parse(line.AsSpan(0, tab), NumberStyles.HexNumber, CultureInfo.InvariantCulture)] = folded.ToString();
        }

        return table.ToFrozenDictionary();
    }
}
