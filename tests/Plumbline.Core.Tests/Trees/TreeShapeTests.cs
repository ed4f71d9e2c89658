using Plumbline.Core.Trees;

namespace Plumbline.Core.Tests.Trees;

public sealed class TreeShapeTests
{
    [Fact]
    public void Default_PublishedShape()
    {
        var shape = TreeShape.Default;

        Assert.Equal(2, shape.MaxDepth);
        Assert.Equal((3, 1.0, 1.0), (shape.AtDepth(1).Width, shape.AtDepth(1).Decoding.TopP, shape.AtDepth(1).Decoding.Temperature));
        Assert.Equal((1, true), (shape.AtDepth(2).Width, shape.AtDepth(2).Decoding.IsGreedy));
        // 2 x 3 at depth 1, then 2 x 1 under each of those six.
        Assert.Equal(18, shape.MaxStatements);
    }

    [Theory]
    [InlineData(0.9, 0.2, Integrity.IntegralTrue)]
    [InlineData(0.1, 0.8, Integrity.IntegralFalse)]
    [InlineData(0.9, 0.8, Integrity.NotIntegral)]
    [InlineData(0.1, 0.2, Integrity.NotIntegral)]
    public void IntegrityOf_AllFourAnswerCombinations(double pTrue, double pTrueOfNegation, Integrity expected) =>
        Assert.Equal(expected, Statement.IntegrityOf(pTrue > 0.5, pTrueOfNegation > 0.5));
}
