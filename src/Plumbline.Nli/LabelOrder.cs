using Plumbline.Core.Entailment;

namespace Plumbline.Nli;

/// <summary>Where each of the three classes sits in the model's output, and the softmax that turns logits into scores.</summary>
internal sealed class LabelOrder
{
    private readonly int entailment;
    private readonly int neutral;
    private readonly int contradiction;

    private LabelOrder(int entailment, int neutral, int contradiction)
    {
        this.entailment = entailment;
        this.neutral = neutral;
        this.contradiction = contradiction;
    }

    public static LabelOrder From(IReadOnlyList<string> labels, string sourceFile)
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

        return new LabelOrder(Find("entailment"), Find("neutral"), Find("contradiction"));
    }

    /// <summary>Softmax in double precision, shifted by the largest logit so no exponent overflows.</summary>
    public EntailmentScores ToScores(ReadOnlySpan<float> logits)
    {
        var largest = Math.Max(logits[0], Math.Max(logits[1], logits[2]));
        var e = Math.Exp(logits[entailment] - (double)largest);
        var n = Math.Exp(logits[neutral] - (double)largest);
        var c = Math.Exp(logits[contradiction] - (double)largest);
        var total = e + n + c;
        return new EntailmentScores(e / total, n / total, c / total);
    }
}
