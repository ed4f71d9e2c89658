namespace Plumbline.LocalModel;

/// <summary>
/// The spellings that count as the answer "True" or "False" (three cases, each with and without a leading
/// space) and the token sequences they take after a given prompt. A spelling is tokenised together with the
/// prompt, because a tokenizer may merge across the boundary; a sequence that another one extends is kept
/// once, as the shorter one, so no probability mass is counted twice.
/// </summary>
internal static class AnswerVariants
{
    public static readonly IReadOnlyList<string> TrueWords = ["True", "true", "TRUE"];

    public static readonly IReadOnlyList<string> FalseWords = ["False", "false", "FALSE"];

    /// <param name="encode">The model's tokenizer (text to token ids, special tokens as the folder configures).</param>
    /// <param name="prompt">The prompt the answer follows.</param>
    /// <param name="promptIds">The prompt's token ids (<paramref name="encode"/> of <paramref name="prompt"/>).</param>
    /// <param name="words">The spellings of one answer.</param>
    public static IReadOnlyList<int[]> Sequences(Func<string, int[]> encode, string prompt, int[] promptIds, IEnumerable<string> words)
    {
        var found = new List<int[]>();
        foreach (var word in words)
        {
            foreach (var variant in new[] { word, " " + word })
            {
                var full = encode(prompt + variant);
                var sequence = full.Length > promptIds.Length && full.AsSpan(0, promptIds.Length).SequenceEqual(promptIds)
                    ? full[promptIds.Length..]
                    : encode(variant);
                if (sequence.Length > 0)
                {
                    found.Add(sequence);
                }
            }
        }

        var kept = new List<int[]>();
        foreach (var sequence in found.OrderBy(s => s.Length))
        {
            if (!kept.Any(k => sequence.AsSpan().StartsWith(k)))
            {
                kept.Add(sequence);
            }
        }

        return kept;
    }
}
