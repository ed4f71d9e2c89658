using Plumbline.Nli.Tokenization;

namespace Plumbline.Nli.Tests;

public sealed class PairLayoutTests
{
    [Theory]
    // Hand-computed: drop from the longer side one token at a time, from the premise on ties.
    [InlineData(10, 3, 12, 9, 3)]
    [InlineData(3, 10, 12, 3, 9)]
    [InlineData(7, 7, 12, 6, 6)]
    [InlineData(8, 7, 12, 6, 6)]
    [InlineData(4, 4, 12, 4, 4)]
    [InlineData(0, 20, 5, 0, 5)]
    public void Fit_OverBudget_CutsLongerSideFirst(int first, int second, int budget, int expectedFirst, int expectedSecond)
    {
        Assert.Equal((expectedFirst, expectedSecond), PairLayout.Fit(first, second, budget));
    }

    [Fact]
    public void Frame_BertStyle_PutsSegmentIdOneOnHypothesisAndItsSeparator()
    {
        var layout = new PairLayout(101, 102, DoubleSeparator: false, SecondSegmentHasOwnType: true);

        var pair = layout.Frame([5, 6], [7], maxLength: 16);

        Assert.Equal([101, 5, 6, 102, 7, 102], pair.InputIds);
        Assert.Equal([0, 0, 0, 0, 1, 1], pair.TypeIds);
        Assert.False(pair.Truncated);
    }

    [Fact]
    public void Frame_RobertaStyleOverMaxLength_CountsFourSpecialTokensAndFlagsTruncation()
    {
        var layout = new PairLayout(0, 2, DoubleSeparator: true, SecondSegmentHasOwnType: false);

        var pair = layout.Frame([10, 11, 12, 13], [20, 21], maxLength: 8);

        Assert.Equal([0, 10, 11, 2, 2, 20, 21, 2], pair.InputIds);
        Assert.True(pair.Truncated);
    }
}
