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
        IReadOnlyList<EntailmentScores> scores;
        var truncated = 0;
        if (scorer is OnnxEntailmentScorer onnx)
        {
            var details = await onnx.ScoreWithDetailsAsync(sentencePairs, cancellationToken);
            scores = details.Select(detail => detail.Scores).ToArray();
            truncated = details.Count(detail => detail.Truncated);
        }
        else
        {
            scores = await scorer.ScoreAsync(sentencePairs, cancellationToken);
        }

        var elapsed = timeProvider.GetElapsedTime(started);
        if (scores.Count != pairs.Count)
        {
            throw new InvalidOperationException($"scorer returned {scores.Count} scores for {pairs.Count} pairs");
        }

        var confusion = NliConfusionMatrix.From(pairs.Select((pair, index) => (pair.Gold, scores[index].Kind)));
        var calibration = CalibrationBins.ExpectedCalibrationError(
            pairs.Select((pair, index) => (scores[index].ProbabilityOf(scores[index].Kind), scores[index].Kind == pair.Gold)).ToArray());
        return new NliEvaluation(scorer.Describe, confusion, elapsed, truncated, calibration);
    }
}
