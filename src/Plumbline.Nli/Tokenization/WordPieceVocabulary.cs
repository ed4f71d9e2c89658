namespace Plumbline.Nli.Tokenization;

/// <summary>
/// A WordPiece vocabulary (vocab.txt, one token per line, id = line number) split into word-initial pieces and
/// "##" continuation pieces, so that lookups need no string concatenation.
/// </summary>
internal sealed class WordPieceVocabulary
{
    private const string ContinuationPrefix = "##";

    private readonly Dictionary<string, int>.AlternateLookup<ReadOnlySpan<char>> initial;
    private readonly Dictionary<string, int>.AlternateLookup<ReadOnlySpan<char>> continuation;

    private WordPieceVocabulary(Dictionary<string, int> initial, Dictionary<string, int> continuation, int size, int unknown, int classification, int separator, int padding)
    {
        Size = size;
        this.initial = initial.GetAlternateLookup<ReadOnlySpan<char>>();
        this.continuation = continuation.GetAlternateLookup<ReadOnlySpan<char>>();
        Unknown = unknown;
        Classification = classification;
        Separator = separator;
        Padding = padding;
    }

    /// <summary>Number of ids, one per line of the file.</summary>
    public int Size { get; }

    public int Unknown { get; }

    public int Classification { get; }

    public int Separator { get; }

    public int Padding { get; }

    public static WordPieceVocabulary Load(string file)
    {
        string[] lines;
        try
        {
            lines = File.ReadAllLines(file);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new NliModelException(file, e is FileNotFoundException ? "vocabulary file not found" : $"cannot read vocabulary: {e.Message}", e);
        }

        var initial = new Dictionary<string, int>(StringComparer.Ordinal);
        var continuation = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var id = 0; id < lines.Length; id++)
        {
            // A repeated token keeps its last line, as a dictionary built line by line would.
            if (lines[id].StartsWith(ContinuationPrefix, StringComparison.Ordinal) && lines[id].Length > ContinuationPrefix.Length)
            {
                continuation[lines[id][ContinuationPrefix.Length..]] = id;
            }

            initial[lines[id]] = id;
        }

        int Special(string token) => initial.TryGetValue(token, out var id)
            ? id
            : throw new NliModelException(file, $"vocabulary has no {token} token");

        return new WordPieceVocabulary(initial, continuation, lines.Length, Special("[UNK]"), Special("[CLS]"), Special("[SEP]"), Special("[PAD]"));
    }

    public bool TryGetInitial(ReadOnlySpan<char> piece, out int id) => initial.TryGetValue(piece, out id);

    public bool TryGetContinuation(ReadOnlySpan<char> piece, out int id) => continuation.TryGetValue(piece, out id);
}
