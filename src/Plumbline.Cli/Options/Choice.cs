using System.CommandLine;

namespace Plumbline.Cli.Options;

/// <summary>
/// An option whose value is one of a few words, each standing for one value of <typeparamref name="T"/>. The
/// default is the word of the engine's default, so help shows what a run uses when the option is absent.
/// </summary>
internal sealed class Choice<T>
    where T : notnull
{
    private readonly (string Word, T Value)[] words;

    public Choice(string name, string description, T defaultValue, params (string Word, T Value)[] words)
    {
        this.words = words;
        Option = new Option<string?>(name)
        {
            Description = description,
            HelpName = string.Join('|', words.Select(w => w.Word)),
            DefaultValueFactory = _ => WordOf(defaultValue),
        };
        Option.AcceptOnlyFromAmong([.. words.Select(w => w.Word)]);
    }

    public Option<string?> Option { get; }

    public T Read(ParseResult parse)
    {
        var word = parse.GetValue(Option);
        return words.First(w => w.Word == word).Value;
    }

    public string WordOf(T value) => words.First(w => EqualityComparer<T>.Default.Equals(w.Value, value)).Word;
}
