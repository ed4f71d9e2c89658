using System.CommandLine.Parsing;
using System.Globalization;

namespace Plumbline.Cli.Options;

/// <summary>Parses a numeric option value in the invariant culture, with a message naming the option and what it wants.</summary>
internal static class NumberParsing
{
    public static double Parse(ArgumentResult result, string option, string wanted, Func<double, bool> accept)
    {
        var token = result.Tokens.Count > 0 ? result.Tokens[^1].Value : string.Empty;
        if (double.TryParse(token, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) && double.IsFinite(value) && accept(value))
        {
            return value;
        }

        result.AddError($"{option}: '{token}' is not {wanted}");
        return 0;
    }
}
