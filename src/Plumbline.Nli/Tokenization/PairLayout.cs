namespace Plumbline.Nli.Tokenization;

/// <summary>
/// How a tokenised pair is framed with special tokens: BERT-style "[CLS] a [SEP] b [SEP]" with segment ids
/// 0 then 1, or RoBERTa-style "&lt;s&gt; a &lt;/s&gt;&lt;/s&gt; b &lt;/s&gt;" with a single segment.
/// </summary>
internal sealed record PairLayout(int Start, int Separator, bool DoubleSeparator, bool SecondSegmentHasOwnType)
{
    private int SpecialTokens => DoubleSeparator ? 4 : 3;

    /// <summary>Frames both sides, first cutting the longer side token by token until the pair fits in maxLength.</summary>
    public EncodedPair Frame(IReadOnlyList<int> premise, IReadOnlyList<int> hypothesis, int maxLength)
    {
        var (first, second) = Fit(premise.Count, hypothesis.Count, maxLength - SpecialTokens);
        var ids = new long[first + second + SpecialTokens];
        var types = new long[ids.Length];
        var at = 0;
        ids[at++] = Start;
        for (var i = 0; i < first; i++)
        {
            ids[at++] = premise[i];
        }

        ids[at++] = Separator;
        if (DoubleSeparator)
        {
            ids[at++] = Separator;
        }

        var secondStart = at;
        for (var i = 0; i < second; i++)
        {
            ids[at++] = hypothesis[i];
        }

        ids[at] = Separator;
        if (SecondSegmentHasOwnType)
        {
            types.AsSpan(secondStart).Fill(1);
        }

        return new EncodedPair(ids, types, first < premise.Count || second < hypothesis.Count);
    }

    /// <summary>Longest side first: while over budget drop the last token of the longer side, the premise on a tie.</summary>
    internal static (int First, int Second) Fit(int first, int second, int budget)
    {
        while (first + second > budget)
        {
            if (first >= second)
            {
                first--;
            }
            else
            {
                second--;
            }
        }

        return (first, second);
    }
}
