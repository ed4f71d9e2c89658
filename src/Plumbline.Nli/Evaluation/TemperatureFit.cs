namespace Plumbline.Nli.Evaluation;

/// <summary>
/// Temperature scaling: the one number T that minimises the negative log-likelihood of the gold labels under
/// softmax(logits / T) on held-out pairs. It changes no predicted class, only how sure the probabilities are.
/// Log-probabilities work as logits here, because a constant added to a pair's logits cancels in the softmax.
/// </summary>
public static class TemperatureFit
{
    private const double Lowest = 0.05;
    private const double Highest = 20.0;

    /// <summary>Fits T by golden-section search on log T, which the negative log-likelihood is unimodal in.</summary>
    /// <param name="logits">Per pair, the three class logits (or log-probabilities) in one fixed order.</param>
    /// <param name="gold">Per pair, the index of the gold class in that order.</param>
    public static double Fit(IReadOnlyList<double[]> logits, IReadOnlyList<int> gold)
    {
        ArgumentNullException.ThrowIfNull(logits);
        ArgumentNullException.ThrowIfNull(gold);
        if (logits.Count == 0 || logits.Count != gold.Count)
        {
            throw new ArgumentException($"need one gold label per pair and at least one pair; got {logits.Count} pairs and {gold.Count} labels");
        }

        double Loss(double logT) => NegativeLogLikelihood(logits, gold, Math.Exp(logT));
        var ratio = (Math.Sqrt(5) - 1) / 2;
        double a = Math.Log(Lowest), b = Math.Log(Highest);
        double c = b - (ratio * (b - a)), d = a + (ratio * (b - a));
        double fc = Loss(c), fd = Loss(d);
        while (b - a > 1e-7)
        {
            if (fc < fd)
            {
                (b, d, fd) = (d, c, fc);
                c = b - (ratio * (b - a));
                fc = Loss(c);
            }
            else
            {
                (a, c, fc) = (c, d, fd);
                d = a + (ratio * (b - a));
                fd = Loss(d);
            }
        }

        return Math.Exp((a + b) / 2);
    }

    /// <summary>softmax(logits / T), shifted by the largest logit so no exponent overflows.</summary>
    public static double[] Probabilities(double[] logits, double temperature)
    {
        ArgumentNullException.ThrowIfNull(logits);
        var largest = logits.Max();
        var exps = logits.Select(logit => Math.Exp((logit - largest) / temperature)).ToArray();
        var sum = exps.Sum();
        return [.. exps.Select(e => e / sum)];
    }

    /// <summary>Mean negative log-likelihood of the gold classes under softmax(logits / T).</summary>
    public static double NegativeLogLikelihood(IReadOnlyList<double[]> logits, IReadOnlyList<int> gold, double temperature)
    {
        ArgumentNullException.ThrowIfNull(logits);
        ArgumentNullException.ThrowIfNull(gold);
        var total = 0.0;
        for (var i = 0; i < logits.Count; i++)
        {
            var row = logits[i];
            var largest = row.Max() / temperature;
            var sum = row.Sum(logit => Math.Exp((logit / temperature) - largest));
            total += largest + Math.Log(sum) - (row[gold[i]] / temperature);
        }

        return total / logits.Count;
    }
}
