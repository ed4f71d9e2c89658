using System.Text;

namespace Plumbline.Core.Trees;

/// <summary>
/// Identity of a statement for merging: lower case, runs of white space collapsed, trailing
/// punctuation dropped, so that "Water is wet." and "water  is wet" become one node and one variable.
/// </summary>
public readonly record struct StatementKey
{
    // Closing quotes and brackets carry meaning ("(see above)") and are kept.
    private const string FinalPunctuation = ".!?,;:\u2026";

    private StatementKey(string value) => Value = value;

    public string Value { get; }

    public static StatementKey Of(string text)
    {
        var builder = new StringBuilder(text.Length);
        var pendingSpace = false;
        foreach (var c in text.Trim())
        {
            if (char.IsWhiteSpace(c))
            {
                pendingSpace = true;
                continue;
            }

            if (pendingSpace && builder.Length > 0)
            {
                builder.Append(' ');
            }

            pendingSpace = false;
            builder.Append(char.ToLowerInvariant(c));
        }

        var end = builder.Length;
        while (end > 0 && (FinalPunctuation.Contains(builder[end - 1]) || builder[end - 1] == ' '))
        {
            end--;
        }

        return new StatementKey(builder.ToString(0, end));
    }

    public override string ToString() => Value;
}
