using Plumbline.Core.Entailment;

namespace Plumbline.Nli;

/// <summary>
/// Where each of the three classes sits in the model's output, and the softmax that turns logits into scores,
/// after dividing them by the model's calibration temperature (1 when the model states none).
/// </summary>
internal sealed class LabelOrder
{
    private readonly int entailment;
    private readonly int neutral;
    private readonly int contradiction;
    private readonly double temperature;

    private LabelOrder(int entailment, int neutral, int contradiction, double temperature)
    {
        this.entailment = entailment;
        this.neutral = neutral;
        this.contradiction = contradiction;
        this.temperature = temperature;
    }

    public static LabelOrder From(IReadOnlyList<string> labels, string sourceFile, double temperature = 1.0)
    {
        int Find(string name)
        {
            var matches = labels.Select((label, index) => (label, index))
                .Where(item => string.Equals(item.label.Trim(), name, StringComparison.OrdinalIgnoreCase))
                .ToArray();
            return matches.Length == 1
                ? matches[0].index
                : throw new NliModelException(sourceFile, $"labels must name entailment, neutral and contradiction once each; found [{string.Join(", ", labels)}]");
        }

        if (labels.Count != 3)
        {
            throw new NliModelException(sourceFile, $"lists {labels.Count} labels; an NLI model needs 3 (entailment, neutral, contradiction)");
        }

        if (!(temperature > 0) || double.IsInfinity(temperature))
        {
            throw new NliModelException(sourceFile, $"temperature must be a positive number; found {temperature}");
        }

        return new LabelOrder(Find("entailment"), Find("neutral"), Find("contradiction"), temperature);
    }

    /// <summary>Softmax of logits / temperature in double precision, shifted by the largest logit so no exponent overflows.</summary>
    public EntailmentScores ToScores(ReadOnlySpan<float> logits)
    {
        var largest = Math.Max(logits[0], Math.Max(logits[1], logits[2]));
        var e = Math.Exp((logits[entailment] - (double)largest) / temperature);
        var n = Math.Exp((logits[neutral] - (double)largest) / temperature);
        var c = Math.Exp((logits[contradiction] - (double)largest) / temperature);
        var total = e + n + c;
        return new EntailmentScores(e / total, n / total, c / total);
    }
}
