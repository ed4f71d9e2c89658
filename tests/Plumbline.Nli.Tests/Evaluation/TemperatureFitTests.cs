using Plumbline.Nli.Evaluation;

namespace Plumbline.Nli.Tests.Evaluation;

public sealed class TemperatureFitTests
{
    /// <summary>
    /// Pairs drawn from a model whose true class probabilities are softmax(z / 2) while it reports logits z: the
    /// fit must find T close to 2, and the likelihood there must beat T = 1.
    /// </summary>
    [Fact]
    public void Fit_LabelsDrawnAtTemperatureTwo_RecoversTwo()
    {
        var random = new Random(20261202);
        var logits = new List<double[]>();
        var gold = new List<int>();
        for (var i = 0; i < 20_000; i++)
        {
            var z = new[] { random.NextDouble() * 6 - 3, random.NextDouble() * 6 - 3, random.NextDouble() * 6 - 3 };
            var p = z.Select(v => Math.Exp(v / 2)).ToArray();
            var u = random.NextDouble() * p.Sum();
            var label = u < p[0] ? 0 : u < p[0] + p[1] ? 1 : 2;
            logits.Add(z);
            gold.Add(label);
        }

        var t = TemperatureFit.Fit(logits, gold);

        Assert.InRange(t, 1.9, 2.1);
        Assert.True(TemperatureFit.NegativeLogLikelihood(logits, gold, t) < TemperatureFit.NegativeLogLikelihood(logits, gold, 1));
    }

    /// <summary>Two pairs worked out by hand: logits (ln 3, 0, 0) with gold 0 and gold 1 at T = 1 give
    /// probabilities 3/5 and 1/5, so the mean loss is (ln(5/3) + ln 5) / 2.</summary>
    [Fact]
    public void NegativeLogLikelihood_HandComputedPairs()
    {
        var logits = new List<double[]> { new[] { Math.Log(3), 0, 0 }, new[] { Math.Log(3), 0, 0 } };

        var loss = TemperatureFit.NegativeLogLikelihood(logits, [0, 1], 1);

        Assert.Equal((Math.Log(5.0 / 3) + Math.Log(5)) / 2, loss, 12);
    }

    [Fact]
    public void Fit_MismatchedCounts_Throws() =>
        Assert.Throws<ArgumentException>(() => TemperatureFit.Fit([new double[] { 1, 0, 0 }], [0, 1]));
}
