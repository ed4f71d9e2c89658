namespace Plumbline.Models.Http;

/// <summary>
/// Reads the model's belief in "True" versus "False" from the alternatives listed for its first answer
/// token: the probability mass of every spelling of each answer (any case, with or without leading
/// space or a tokenizer's word-start marker) is added up, and the two sums are renormalised over the
/// two answers by the caller.
/// </summary>
public static class AnswerTokenMass
{
    /// <summary>The summed probabilities of the True and False spellings, or null when neither is among
    /// the alternatives. An answer missing from the list while the other is present counts as 0: its
    /// real mass is below the smallest listed alternative, so the error is bounded by that.</summary>
    public static (double True, double False)? Of(IEnumerable<TokenAlternative> alternatives)
    {
        ArgumentNullException.ThrowIfNull(alternatives);
        double pTrue = 0, pFalse = 0;
        var found = false;
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var alternative in alternatives)
        {
            // An endpoint may list the chosen token again among the top ones; count each spelling once.
            if (!seen.Add(alternative.Token) || !double.IsFinite(alternative.LogProbability))
            {
                continue;
            }

            switch (AnswerOf(alternative.Token))
            {
                case true:
                    pTrue += Math.Exp(alternative.LogProbability);
                    found = true;
                    break;
                case false:
                    pFalse += Math.Exp(alternative.LogProbability);
                    found = true;
                    break;
            }
        }

        return found ? (pTrue, pFalse) : null;
    }

    /// <summary>True or False when the token (or the start of a sampled answer) spells one of the answers, else null.</summary>
    public static bool? AnswerOf(string token)
    {
        ArgumentNullException.ThrowIfNull(token);
        // U+2581 and U+0120 are the word-start markers of SentencePiece and byte-level BPE vocabularies,
        // which some servers pass through undecoded.
        var word = token.Trim().TrimStart('\u2581', '\u0120', '*', '"', '\'').TrimEnd('.', ',', '!', '*', '"', '\'');
        if (word.Equals("true", StringComparison.OrdinalIgnoreCase))
        {
            return true;
        }

        return word.Equals("false", StringComparison.OrdinalIgnoreCase) ? false : null;
    }
}
