namespace Plumbline.Nli.Tokenization;

/// <summary>
/// SentencePiece's BPE segmentation of already normalised text. Text starts as single characters, except that a
/// user-defined piece is taken whole and never merged further; then, again and again, the adjacent pair whose
/// joined text is a piece with the highest score is joined (the leftmost such pair on a tie) until no adjacent pair
/// forms a piece. A symbol that is no piece becomes the unknown id. Thread-safe: all state is per call.
/// </summary>
internal sealed class SentencePieceBpeMerges
{
    private readonly Dictionary<string, int>.AlternateLookup<ReadOnlySpan<char>> ids;
    private readonly Dictionary<string, int>.AlternateLookup<ReadOnlySpan<char>> mergeable;
    private readonly HashSet<string>.AlternateLookup<ReadOnlySpan<char>> userDefined;
    private readonly int longestUserDefined;
    private readonly float[] scores;
    private readonly int unknownId;

    public SentencePieceBpeMerges(IReadOnlyList<SentencePiece> pieces, int unknownId)
    {
        var all = new Dictionary<string, int>(StringComparer.Ordinal);
        var joinable = new Dictionary<string, int>(StringComparer.Ordinal);
        var whole = new HashSet<string>(StringComparer.Ordinal);
        scores = new float[pieces.Count];
        for (var id = 0; id < pieces.Count; id++)
        {
            var piece = pieces[id];
            all.TryAdd(piece.Text, id);
            scores[id] = piece.Score;

            // Control, unknown and byte pieces are never the result of a merge; user-defined ones only match whole.
            if (piece.Type is SentencePieceType.Normal or SentencePieceType.UserDefined)
            {
                joinable.TryAdd(piece.Text, id);
            }

            if (piece.Type == SentencePieceType.UserDefined && piece.Text.Length > 0)
            {
                whole.Add(piece.Text);
                longestUserDefined = Math.Max(longestUserDefined, piece.Text.Length);
            }
        }

        ids = all.GetAlternateLookup<ReadOnlySpan<char>>();
        mergeable = joinable.GetAlternateLookup<ReadOnlySpan<char>>();
        userDefined = whole.GetAlternateLookup<ReadOnlySpan<char>>();
        this.unknownId = unknownId;
    }

    public List<int> Encode(ReadOnlySpan<char> text)
    {
        var symbols = Split(text);
        var agenda = new PriorityQueue<Candidate, Candidate>(CandidateOrder.Instance);
        for (var i = 0; i + 1 < symbols.Count; i++)
        {
            Consider(text, symbols, i, i + 1, agenda);
        }

        while (agenda.TryDequeue(out var best, out _))
        {
            var left = symbols[best.Left];
            var right = symbols[best.Right];

            // A pair queued before one of its symbols changed no longer describes the text.
            if (left.Length == 0 || right.Length == 0 || left.Length + right.Length != best.Length)
            {
                continue;
            }

            symbols[best.Left] = left with { Length = best.Length, Next = right.Next };
            symbols[best.Right] = right with { Length = 0 };
            if (right.Next >= 0)
            {
                symbols[right.Next] = symbols[right.Next] with { Previous = best.Left };
            }

            Consider(text, symbols, left.Previous, best.Left, agenda);
            Consider(text, symbols, best.Left, right.Next, agenda);
        }

        var result = new List<int>(symbols.Count);
        for (var i = symbols.Count == 0 ? -1 : 0; i >= 0; i = symbols[i].Next)
        {
            var symbol = symbols[i];
            result.Add(ids.TryGetValue(text.Slice(symbol.Start, symbol.Length), out var id) ? id : unknownId);
        }

        return result;
    }

    private List<Symbol> Split(ReadOnlySpan<char> text)
    {
        var symbols = new List<Symbol>(text.Length);
        var at = 0;
        while (at < text.Length)
        {
            var length = UserDefinedAt(text[at..]);
            var frozen = length > 0;
            if (!frozen)
            {
                length = char.IsHighSurrogate(text[at]) && at + 1 < text.Length && char.IsLowSurrogate(text[at + 1]) ? 2 : 1;
            }

            symbols.Add(new Symbol(at, length, symbols.Count - 1, at + length < text.Length ? symbols.Count + 1 : -1, frozen));
            at += length;
        }

        return symbols;
    }

    /// <summary>Length of the longest user-defined piece the text starts with, or 0.</summary>
    private int UserDefinedAt(ReadOnlySpan<char> text)
    {
        for (var length = Math.Min(longestUserDefined, text.Length); length > 0; length--)
        {
            if (userDefined.Contains(text[..length]))
            {
                return length;
            }
        }

        return 0;
    }

    private void Consider(ReadOnlySpan<char> text, List<Symbol> symbols, int left, int right, PriorityQueue<Candidate, Candidate> agenda)
    {
        if (left < 0 || right < 0 || symbols[left].Frozen || symbols[right].Frozen)
        {
            return;
        }

        var joined = symbols[left].Length + symbols[right].Length;
        if (mergeable.TryGetValue(text.Slice(symbols[left].Start, joined), out var id))
        {
            var candidate = new Candidate(left, right, joined, scores[id]);
            agenda.Enqueue(candidate, candidate);
        }
    }

    /// <summary>A run of the text; merged-away symbols keep Length 0. Previous and Next link the live symbols.</summary>
    private readonly record struct Symbol(int Start, int Length, int Previous, int Next, bool Frozen);

    private readonly record struct Candidate(int Left, int Right, int Length, float Score);

    /// <summary>Dequeues the highest score first, and among equal scores the leftmost pair.</summary>
    private sealed class CandidateOrder : IComparer<Candidate>
    {
        public static readonly CandidateOrder Instance = new();

        public int Compare(Candidate x, Candidate y) =>
            x.Score != y.Score ? y.Score.CompareTo(x.Score) : x.Left.CompareTo(y.Left);
    }
}
