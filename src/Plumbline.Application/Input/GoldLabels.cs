namespace Plumbline.Application.Input;

/// <summary>The spellings a gold label may take in a claim file, the same for every format.</summary>
public static class GoldLabels
{
    /// <summary>Accepted words, case ignored: true/false, yes/no, 1/0.</summary>
    public const string Accepted = "true, false, yes, no, 1 or 0";

    /// <summary>Reads a label; an empty text is "no label". False when the word is unknown.</summary>
    public static bool TryParse(string text, out bool? gold)
    {
        ArgumentNullException.ThrowIfNull(text);
        gold = null;
        switch (text.Trim().ToLowerInvariant())
        {
            case "":
                return true;
            case "true" or "yes" or "1":
                gold = true;
                return true;
            case "false" or "no" or "0":
                gold = false;
                return true;
            default:
                return false;
        }
    }

    /// <summary>The problem text for an unknown label.</summary>
    public static string Unknown(string text) => $"unknown label '{Shorten(text)}' (use {Accepted}, or leave it out)";

    private static string Shorten(string text) => text.Length <= 40 ? text : text[..39] + "\u2026";
}
