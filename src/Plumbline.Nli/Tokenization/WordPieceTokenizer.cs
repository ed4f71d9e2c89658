using System.Text;

namespace Plumbline.Nli.Tokenization;

/// <summary>Greedy longest-match-first WordPiece over the words of <see cref="BertPreTokenizer"/>.</summary>
internal sealed class WordPieceTokenizer(WordPieceVocabulary vocabulary, bool lowerCase)
{
    // Longer words become one unknown token rather than a long run of fragments (common practice).
    private const int LongestWord = 100;

    public WordPieceVocabulary Vocabulary => vocabulary;

    public List<int> Encode(string text)
    {
        var ids = new List<int>();
        foreach (var word in BertPreTokenizer.Split(text, lowerCase))
        {
            AppendPieces(word, ids);
        }

        return ids;
    }

    private void AppendPieces(string word, List<int> ids)
    {
        // Lengths count code points, not UTF-16 units, so a piece never splits a surrogate pair.
        var boundaries = RuneBoundaries(word);
        if (boundaries.Length - 1 > LongestWord)
        {
            ids.Add(vocabulary.Unknown);
            return;
        }

        var firstPiece = ids.Count;
        var start = 0;
        while (start < boundaries.Length - 1)
        {
            var found = -1;
            var end = boundaries.Length - 1;
            for (; end > start; end--)
            {
                var piece = word.AsSpan(boundaries[start], boundaries[end] - boundaries[start]);
                if (start == 0 ? vocabulary.TryGetInitial(piece, out var id) : vocabulary.TryGetContinuation(piece, out id))
                {
                    found = id;
                    break;
                }
            }

            if (found < 0)
            {
                ids.RemoveRange(firstPiece, ids.Count - firstPiece);
                ids.Add(vocabulary.Unknown);
                return;
            }

            ids.Add(found);
            start = end;
        }
    }

    private static int[] RuneBoundaries(string word)
    {
        var boundaries = new List<int>(word.Length + 1);
        for (var i = 0; i < word.Length; i += Rune.GetRuneAt(word, i).Utf16SequenceLength)
        {
            boundaries.Add(i);
        }

        boundaries.Add(word.Length);
        return [.. boundaries];
    }
}
