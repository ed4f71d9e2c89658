using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Evaluation;

/// <summary>Scores labelled pairs and compares the most probable class with the gold label.</summary>
public static class NliEvaluator
{
    public static async Task<NliEvaluation> EvaluateAsync(
        IEntailmentScorer scorer,
        IReadOnlyList<LabelledPair> pairs,
        TimeProvider? timeProvider = null,
        CancellationToken cancellationToken = default)
    {
        timeProvider ??= TimeProvider.System;
        var sentencePairs = pairs.Select(pair => pair.Pair).ToArray();
        var started = timeProvider.GetTimestamp();
        IReadOnlyList<EntailmentKind> predicted;
        var truncated = 0;
        if (scorer is OnnxEntailmentScorer onnx)
        {
            var details = await onnx.ScoreWithDetailsAsync(sentencePairs, cancellationToken);
            predicted = details.Select(detail => detail.Scores.Kind).ToArray();
            truncated = details.Count(detail => detail.Truncated);
        }
        else
        {
            predicted = (await scorer.ScoreAsync(sentencePairs, cancellationToken)).Select(scores => scores.Kind).ToArray();
        }

        var elapsed = timeProvider.GetElapsedTime(started);
        if (predicted.Count != pairs.Count)
        {
            throw new InvalidOperationException($"scorer returned {predicted.Count} scores for {pairs.Count} pairs");
        }

        var confusion = NliConfusionMatrix.From(pairs.Select((pair, index) => (pair.Gold, predicted[index])));
        return new NliEvaluation(scorer.Describe, confusion, elapsed, truncated);
    }
}
