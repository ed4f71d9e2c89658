using System.Globalization;
using System.Runtime.CompilerServices;
using Plumbline.Core.Claims;

namespace Plumbline.Application.Input;

/// <summary>Claims as plain text: one claim per line, its id the line number; blank lines are skipped.</summary>
internal static class PlainTextClaims
{
    public static async IAsyncEnumerable<ClaimLine> ReadAsync(
        TextReader reader,
        string source,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        await foreach (var (lineNumber, line, tooLong) in InputLines.ReadAsync(reader, source, cancellationToken))
        {
            yield return tooLong is not null
                ? ClaimLine.Bad(tooLong)
                : ClaimLine.Good(lineNumber, new Claim(JsonLinesClaims.LineId(lineNumber), line.Trim()));
        }
    }

    internal static ClaimFileException TooLong(string source, int line, int length) => new(
        source,
        line,
        null,
        string.Create(CultureInfo.InvariantCulture, $"line is {length} characters long; the limit is {InputLimits.MaxLineCharacters}"));
}
