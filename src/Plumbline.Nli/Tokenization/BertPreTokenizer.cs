using System.Globalization;
using System.Text;

namespace Plumbline.Nli.Tokenization;

/// <summary>
/// The usual BERT basic tokenisation (common practice): drop control characters, treat every kind of space
/// as a separator, stand CJK ideographs apart, fold case and accents for uncased vocabularies, and split
/// punctuation (ASCII symbols included) into words of its own.
/// </summary>
internal static class BertPreTokenizer
{
    public static List<string> Split(string text, bool lowerCase)
    {
        var words = new List<string>();
        foreach (var token in Clean(text).Split([' ', '\u2028', '\u2029'], StringSplitOptions.RemoveEmptyEntries))
        {
            SplitPunctuation(lowerCase ? UncasedFolding.Fold(token) : token, words);
        }

        return words;
    }

    private static string Clean(string text)
    {
        var cleaned = new StringBuilder(text.Length + 8);
        foreach (var rune in text.EnumerateRunes())
        {
            // Malformed UTF-16 enumerates as U+FFFD, which is dropped with the rest.
            if (rune.Value is 0 or 0xFFFD || IsControl(rune))
            {
                continue;
            }

            if (IsWhitespace(rune))
            {
                cleaned.Append(' ');
            }
            else if (IsCjkIdeograph(rune.Value))
            {
                cleaned.Append(' ').AppendRune(rune).Append(' ');
            }
            else
            {
                cleaned.AppendRune(rune);
            }
        }

        return cleaned.ToString();
    }

    private static void SplitPunctuation(string token, List<string> words)
    {
        var start = 0;
        for (var i = 0; i < token.Length;)
        {
            var rune = Rune.GetRuneAt(token, i);
            var next = i + rune.Utf16SequenceLength;
            if (IsPunctuation(rune))
            {
                if (i > start)
                {
                    words.Add(token[start..i]);
                }

                words.Add(token[i..next]);
                start = next;
            }

            i = next;
        }

        if (start < token.Length)
        {
            words.Add(token[start..]);
        }
    }

    private static bool IsControl(Rune rune) =>
        rune.Value is not ('\t' or '\n' or '\r')
        && (UnassignedCodePoints.Contains(rune.Value) || Rune.GetUnicodeCategory(rune) is UnicodeCategory.Control or UnicodeCategory.Format or UnicodeCategory.Surrogate
            or UnicodeCategory.PrivateUse or UnicodeCategory.OtherNotAssigned);

    private static bool IsWhitespace(Rune rune) =>
        rune.Value is ' ' or '\t' or '\n' or '\r' || Rune.GetUnicodeCategory(rune) == UnicodeCategory.SpaceSeparator;

    private static bool IsPunctuation(Rune rune) =>
        rune.Value is (>= 33 and <= 47) or (>= 58 and <= 64) or (>= 91 and <= 96) or (>= 123 and <= 126)
        || Rune.GetUnicodeCategory(rune) is UnicodeCategory.ConnectorPunctuation or UnicodeCategory.DashPunctuation
            or UnicodeCategory.OpenPunctuation or UnicodeCategory.ClosePunctuation or UnicodeCategory.InitialQuotePunctuation
            or UnicodeCategory.FinalQuotePunctuation or UnicodeCategory.OtherPunctuation;

    // The CJK Unified Ideographs blocks and their extensions and compatibility blocks; kana and hangul are not among them.
    private static bool IsCjkIdeograph(int codePoint) =>
        codePoint is (>= 0x4E00 and <= 0x9FFF) or (>= 0x3400 and <= 0x4DBF) or (>= 0x20000 and <= 0x2A6DF)
            or (>= 0x2A700 and <= 0x2B73F) or (>= 0x2B740 and <= 0x2B81F) or (>= 0x2B820 and <= 0x2CEAF)
            or (>= 0xF900 and <= 0xFAFF) or (>= 0x2F800 and <= 0x2FA1F);
}
