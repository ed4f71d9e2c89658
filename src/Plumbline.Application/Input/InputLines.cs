using System.Runtime.CompilerServices;

namespace Plumbline.Application.Input;

/// <summary>The non-blank lines of a line-per-claim input with their numbers; a line over the length limit comes back as a problem.</summary>
internal static class InputLines
{
    public static async IAsyncEnumerable<(int Number, string Text, ClaimFileException? TooLong)> ReadAsync(
        TextReader reader,
        string source,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        var number = 0;
        while (await reader.ReadLineAsync(cancellationToken) is { } line)
        {
            number++;
            if (string.IsNullOrWhiteSpace(line))
            {
                continue;
            }

            yield return line.Length > InputLimits.MaxLineCharacters
                ? (number, string.Empty, PlainTextClaims.TooLong(source, number, line.Length))
                : (number, line, null);
        }
    }
}
