namespace Plumbline.Reports.Comparison;

/// <summary>The formats a comparison can be written in: text, md, json.</summary>
public static class ComparisonWriters
{
    public static IReadOnlyList<string> Formats { get; } = ["text", "md", "json"];

    /// <exception cref="ArgumentException">The format is not one of <see cref="Formats"/>.</exception>
    public static IComparisonWriter Create(string format) => format switch
    {
        "text" => new ComparisonTextWriter(),
        "md" => new ComparisonMarkdownWriter(),
        "json" => new ComparisonJsonWriter(),
        _ => throw new ArgumentException($"unknown comparison format '{format}'; known formats: {string.Join(", ", Formats)}", nameof(format)),
    };

    /// <summary>"true -> false", "settled -> contested": the old and the new value of one field.</summary>
    internal static string Arrow(string old, string now) => $"{old} -> {now}";

    /// <summary>"right", "wrong" or "no gold" for an answer's agreement with its gold label.</summary>
    internal static string Agreement(bool? agrees) => agrees switch
    {
        true => "right",
        false => "wrong",
        null => "no gold",
    };

    /// <summary>What changed in one claim, as "answer true -> false | status settled -> overturned | gold right -> wrong".</summary>
    internal static string Describe(ClaimChange change)
    {
        var parts = new List<string>();
        if (change.AnswerChanged)
        {
            parts.Add("answer " + Arrow(ReportWords.Answer(change.OldAnswer), ReportWords.Answer(change.NewAnswer)));
        }

        if (change.StatusChanged)
        {
            parts.Add("status " + Arrow(ReportWords.Of(change.OldStatus), ReportWords.Of(change.NewStatus)));
        }

        if (change.AgreementChanged)
        {
            parts.Add("gold " + Arrow(Agreement(change.OldAgrees), Agreement(change.NewAgrees)));
        }

        return string.Join(" | ", parts);
    }

    /// <summary>A figure's value: a whole number as such, a share or mean with four decimals, "n/a" when missing.</summary>
    internal static string Figure(double? value) => value switch
    {
        null => "n/a",
        { } v when v == Math.Floor(v) && Math.Abs(v) < 1e12 => v.ToString("0", System.Globalization.CultureInfo.InvariantCulture),
        { } v => ReportText.Weight(v),
    };

    /// <summary>A change with its sign ("+0.0833", "-2", "0").</summary>
    internal static string Change(double? change) => change switch
    {
        null => "n/a",
        0 => "0",
        > 0 => "+" + Figure(change),
        _ => Figure(change),
    };

    /// <summary>The test's split and p-value in words.</summary>
    internal static string Test(PairedTest test)
    {
        var (first, second) = test.Outcome == PairedTest.Correct
            ? ("right before and wrong now", "wrong before and right now")
            : ("true before and false now", "false before and true now");
        var what = test.Outcome == PairedTest.Correct ? "correctness against gold" : "answers";
        return System.FormattableString.Invariant(
            $"paired {what} over {test.Pairs} claims: {test.Test.FirstOnly} {first}, {test.Test.SecondOnly} {second}; McNemar exact p = {ReportText.PValue(test.Test.PValue)}");
    }
}
