using System.Text;

namespace Plumbline.Nli.Tokenization;

/// <summary>Reads the data lines (not blank, not # comments) of a table embedded beside the tokenizer.</summary>
internal static class EmbeddedTable
{
    public static IEnumerable<string> Lines(string name)
    {
        using var stream = typeof(EmbeddedTable).Assembly.GetManifestResourceStream($"Plumbline.Nli.Tokenization.{name}")
            ?? throw new InvalidOperationException($"embedded resource {name} is missing from the build");
        using var reader = new StreamReader(stream, Encoding.ASCII);
        while (reader.ReadLine() is { } line)
        {
            if (line.Length > 0 && line[0] != '#')
            {
                yield return line;
            }
        }
    }
}
