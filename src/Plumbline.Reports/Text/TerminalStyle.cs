using Plumbline.Core.Coherence;

namespace Plumbline.Reports.Text;

/// <summary>ANSI markup when the caller asked for colour, plain text otherwise; the words are the same either way.</summary>
internal sealed class TerminalStyle(bool colour)
{
    private const string Reset = "\u001b[0m";

    public string Strong(string text) => Paint("\u001b[1m", text);

    public string Faint(string text) => Paint("\u001b[2m", text);

    public string Alarm(string text) => Paint("\u001b[31m", text);

    public string Status(ClaimStatus status) => Paint(
        status switch
        {
            ClaimStatus.Settled => "\u001b[32m",
            ClaimStatus.Overturned => "\u001b[33m",
            ClaimStatus.Contested => "\u001b[35m",
            _ => "\u001b[31m",
        },
        ReportWords.Of(status));

    /// <summary>T in cyan, F in yellow (not red and green: those already mean status), - faint.</summary>
    public string Value(bool? value, bool kept) => value switch
    {
        true => Paint("\u001b[36m", "T"),
        false => Paint("\u001b[33m", "F"),
        null => Faint(kept ? "?" : "-"),
    };

    private string Paint(string code, string text) => colour ? code + text + Reset : text;
}
