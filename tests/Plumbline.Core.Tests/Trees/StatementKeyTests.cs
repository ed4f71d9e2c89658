using Plumbline.Core.Trees;

namespace Plumbline.Core.Tests.Trees;

public sealed class StatementKeyTests
{
    [Theory]
    [InlineData("Water is wet.", "water  is WET")]
    [InlineData("  Water\tis wet!  ", "water is wet")]
    [InlineData("Is water wet?", "is water wet")]
    public void Of_CaseSpacingFinalPunctuation_Equal(string a, string b) =>
        Assert.Equal(StatementKey.Of(a), StatementKey.Of(b));

    [Theory]
    [InlineData("Water is wet.", "Water is not wet.")]
    [InlineData("It is (see above)", "It is see above")]
    [InlineData("Mr. Smith left.", "Mr Smith left.")]
    public void Of_DifferentWordsOrInnerPunctuation_Differ(string a, string b) =>
        Assert.NotEqual(StatementKey.Of(a), StatementKey.Of(b));
}
