using System.Text;
using Plumbline.Core.Language;

namespace Plumbline.Core.Coherence;

/// <summary>
/// The prompt templates: short few-shot demonstrations followed by the statement at hand. Bump
/// <see cref="PromptVersion"/> whenever a template changes, because recordings and the response
/// cache are keyed on the version instead of on the rendered text.
/// </summary>
public static class PromptBook
{
    public const string PromptVersion = "1";

    /// <summary>What a negation falls back to when the model cannot write one.</summary>
    public const string NegationPrefix = "It is not true that ";

    // Abduction demonstrations explain both answers for the same statement, the unlikely one too:
    // the method needs an explanation for each answer, not only for the one the model believes.
    private static readonly (string Statement, bool Answer, string Because)[] AbductionDemos =
    [
        ("Penguins can fly", true, "penguins are birds, and birds use their wings to fly."),
        ("Penguins can fly", false, "penguins have stiff flippers built for swimming rather than flight."),
        ("Copper conducts electricity", true, "copper has free electrons that carry an electric current."),
        ("A tomato is a vegetable", false, "a tomato develops from a flower and holds seeds, which makes it a fruit."),
        ("A tomato is a vegetable", true, "tomatoes are cooked and served in savoury dishes like other vegetables."),
        ("Ice sinks in water", false, "ice is less dense than liquid water, so it floats."),
    ];

    private static readonly (string Statement, string Opposite)[] NegationDemos =
    [
        ("Penguins can fly.", "Penguins cannot fly."),
        ("Copper has free electrons.", "Copper has no free electrons."),
        ("Every week has seven days.", "Not every week has seven days."),
        ("Ice is less dense than water.", "Ice is not less dense than water."),
    ];

    private static readonly (string Statement, bool Answer)[] AnswerDemos =
    [
        ("Penguins can fly", false),
        ("Copper conducts electricity", true),
        ("Ice sinks in water", false),
        ("A week has seven days", true),
    ];

    /// <summary>Ends with "&lt;statement&gt;? True, because" (or False); the model continues with the explanation.</summary>
    public static string Abduction(string statement, bool answer)
    {
        var prompt = new StringBuilder("Explain the given answer to each question in one sentence.\n\n");
        foreach (var (demo, demoAnswer, because) in AbductionDemos)
        {
            prompt.Append("Q: ").Append(demo).Append("?\nA: ").Append(Word(demoAnswer)).Append(", because ").Append(because).Append("\n\n");
        }

        return prompt.Append("Q: ").Append(AsQuestion(statement)).Append("\nA: ").Append(Word(answer)).Append(", because").ToString();
    }

    /// <summary>Asks for the statement rewritten to say the opposite; the model continues after "Opposite:".</summary>
    public static string Negation(string statement)
    {
        var prompt = new StringBuilder("Rewrite each statement so that it says the opposite.\n\n");
        foreach (var (demo, opposite) in NegationDemos)
        {
            prompt.Append("Statement: ").Append(demo).Append("\nOpposite: ").Append(opposite).Append("\n\n");
        }

        return prompt.Append("Statement: ").Append(statement.Trim()).Append("\nOpposite:").ToString();
    }

    /// <summary>Ends with "True or False?\nA:"; backends with token probabilities compare " True" with " False" next.</summary>
    public static string Answer(string statement)
    {
        var prompt = new StringBuilder("Answer each question with True or False.\n\n");
        foreach (var (demo, demoAnswer) in AnswerDemos)
        {
            prompt.Append("Q: ").Append(demo).Append("? True or False?\nA: ").Append(Word(demoAnswer)).Append("\n\n");
        }

        return prompt.Append("Q: ").Append(AsQuestion(statement)).Append(" True or False?\nA:").ToString();
    }

    /// <summary>The prompt of a generation request, as the engine renders it for that purpose.</summary>
    public static string Render(GenerationPurpose purpose, string subject, bool? answer) => purpose switch
    {
        GenerationPurpose.Abduction => Abduction(subject, answer ?? throw new ArgumentException("an abduction is written for an answer", nameof(answer))),
        GenerationPurpose.Negation => Negation(subject),
        _ => throw new ArgumentOutOfRangeException(nameof(purpose), purpose, "unknown generation purpose"),
    };

    /// <summary>The fixed-prefix negation: "It is not true that &lt;statement&gt;."</summary>
    public static string PrefixNegation(string statement)
    {
        var body = StripFinalPunctuation(statement);
        return NegationPrefix + LowerLeadingFunctionWord(body) + ".";
    }

    private static string Word(bool answer) => answer ? "True" : "False";

    private static string AsQuestion(string statement) => StripFinalPunctuation(statement) + "?";

    private static string StripFinalPunctuation(string statement) => statement.Trim().TrimEnd('.', '!', '?', ';', ':', ',', ' ');

    // Only words that are never names are lowered, so "Paris is ..." keeps its capital.
    private static string LowerLeadingFunctionWord(string text)
    {
        var space = text.IndexOf(' ');
        var first = space < 0 ? text : text[..space];
        return LowerableWords.Contains(first) ? char.ToLowerInvariant(text[0]) + text[1..] : text;
    }

    private static readonly HashSet<string> LowerableWords = new(StringComparer.Ordinal)
    {
        "A", "An", "The", "This", "That", "These", "Those", "It", "Its", "There", "They", "We", "You",
        "He", "She", "Some", "All", "Most", "Many", "Every", "Each", "No", "Any", "Few", "Several",
        "Both", "If", "When", "In", "On", "At", "For", "One", "People",
    };
}
