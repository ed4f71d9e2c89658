using Plumbline.Core.Coherence;

namespace Plumbline.Core.Tests.Coherence;

public sealed class PromptBookTests
{
    [Theory]
    [InlineData(true, "Q: Owls hunt at night?\nA: True, because")]
    [InlineData(false, "Q: Owls hunt at night?\nA: False, because")]
    public void Abduction_Statement_EndsAskingForTheExplanation(bool answer, string ending) =>
        Assert.EndsWith(ending, PromptBook.Abduction("Owls hunt at night.", answer), StringComparison.Ordinal);

    [Fact]
    public void Answer_Statement_EndsWithTheQuestion() =>
        Assert.EndsWith("Q: Owls hunt at night? True or False?\nA:", PromptBook.Answer("Owls hunt at night."), StringComparison.Ordinal);

    [Fact]
    public void Negation_Statement_EndsAskingForTheOpposite() =>
        Assert.EndsWith("Statement: Owls hunt at night.\nOpposite:", PromptBook.Negation(" Owls hunt at night. "), StringComparison.Ordinal);

    [Theory]
    [InlineData("The sun is hot.", "It is not true that the sun is hot.")]
    [InlineData("Paris is in France!", "It is not true that Paris is in France.")]
    public void PrefixNegation_Statement_Prefixed(string statement, string expected) =>
        Assert.Equal(expected, PromptBook.PrefixNegation(statement));

    [Fact]
    public void Abduction_Statement_AskedOnceAfterDemonstrations()
    {
        var prompt = PromptBook.Abduction("Owls hunt at night", true);

        Assert.Equal(1, CountOf(prompt, "Owls hunt at night"));
        Assert.True(CountOf(prompt, ", because") >= 4);
    }

    private static int CountOf(string text, string part) => (text.Length - text.Replace(part, "", StringComparison.Ordinal).Length) / part.Length;
}
