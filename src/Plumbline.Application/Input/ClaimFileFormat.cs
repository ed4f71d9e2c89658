namespace Plumbline.Application.Input;

/// <summary>How a claim input is laid out.</summary>
public enum ClaimFileFormat
{
    /// <summary>Chosen from the file name's extension, or from the first line of standard input.</summary>
    Auto,

    /// <summary>One JSON object per line: <c>{"id", "claim", "gold", "tags"}</c>.</summary>
    JsonLines,

    /// <summary>Comma-separated values with a header naming the columns (id, claim, gold, tags).</summary>
    Csv,

    /// <summary>One claim per line; its id is the line number.</summary>
    PlainText,
}
