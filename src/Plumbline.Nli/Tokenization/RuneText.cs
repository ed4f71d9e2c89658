using System.Text;

namespace Plumbline.Nli.Tokenization;

internal static class RuneText
{
    /// <summary>Appends a rune's UTF-16 units; StringBuilder has no Rune overload and would box it through Append(object).</summary>
    public static StringBuilder AppendRune(this StringBuilder builder, Rune rune)
    {
        if (rune.IsBmp)
        {
            return builder.Append((char)rune.Value);
        }

        Span<char> units = stackalloc char[2];
        rune.EncodeToUtf16(units);
        return builder.Append(units);
    }
}
