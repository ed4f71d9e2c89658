using System.Globalization;
using System.Text;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Cli.Commands;

/// <summary>
/// How <c>plumb nli --eval</c> shows evaluations: per file, accuracy, the false-contradiction rate, the calibration
/// error, per-class precision and recall, the confusion matrix and speed; for several files, a table of all of them.
/// </summary>
internal static class NliEvaluationOutput
{
    public static string Text(IReadOnlyList<(LabelledPairSet Pairs, NliEvaluation Evaluation)> evaluations)
    {
        var text = new StringBuilder();
        foreach (var (pairs, evaluation) in evaluations)
        {
            text.Append(Text(pairs, evaluation)).Append('\n');
        }

        if (evaluations.Count > 1)
        {
            var c = CultureInfo.InvariantCulture;
            var width = Math.Max(4, evaluations.Max(e => Path.GetFileName(e.Pairs.File).Length));
            text.Append(c, $"{"file".PadRight(width)} {"pairs",7} {"accuracy",9} {"false contradiction",20} {"calibration error",18}\n");
            foreach (var (pairs, evaluation) in evaluations)
            {
                text.Append(c, $"{Path.GetFileName(pairs.File).PadRight(width)} {evaluation.Pairs,7} {evaluation.Accuracy,9:0.0000} {Ratio(evaluation.FalseContradictionRate),20} {evaluation.CalibrationError,18:0.0000}\n");
            }
        }

        return text.ToString().TrimEnd('\n') + "\n";
    }

    private static string Text(LabelledPairSet pairs, NliEvaluation evaluation)
    {
        var text = new StringBuilder();
        var c = CultureInfo.InvariantCulture;
        text.Append(c, $"nli evaluation of {pairs.File}\n");
        text.Append(c, $"  model      {evaluation.Model}\n");
        text.Append(c, $"  pairs      {evaluation.Pairs} ({pairs.SkippedUnlabelled} unlabelled skipped, {evaluation.TruncatedPairs} truncated to the model's maximum length)\n");
        text.Append(c, $"  accuracy   {evaluation.Accuracy:0.0000} ({evaluation.Correct}/{evaluation.Pairs})\n");
        text.Append(c, $"  false contradiction  {Ratio(evaluation.FalseContradictionRate)} ({evaluation.FalseContradictions} of {evaluation.NotContradictionPairs} pairs whose gold is not contradiction)\n");
        text.Append(c, $"  calibration error    {evaluation.CalibrationError:0.0000} (expected calibration error of the predicted class, {CalibrationBins.DefaultBins} bins)\n");
        text.Append(c, $"  speed      {evaluation.PairsPerSecond:0.0} pairs/s ({evaluation.Elapsed.TotalSeconds:0.000} s)\n\n");

        text.Append(c, $"  {"class",-14} {"precision",9} {"recall",9} {"gold",7} {"predicted",9}\n");
        foreach (var metrics in evaluation.Classes)
        {
            text.Append(c, $"  {NliCommand.LabelOf(metrics.Kind),-14} {Ratio(metrics.Precision),9} {Ratio(metrics.Recall),9} {metrics.Gold,7} {metrics.Predicted,9}\n");
        }

        text.Append("\n  confusion (rows: gold, columns: predicted)\n");
        text.Append(c, $"  {"",-14}");
        foreach (var predicted in NliConfusionMatrix.Kinds)
        {
            text.Append(c, $" {NliCommand.LabelOf(predicted),13}");
        }

        text.Append('\n');
        foreach (var gold in NliConfusionMatrix.Kinds)
        {
            text.Append(c, $"  {NliCommand.LabelOf(gold),-14}");
            foreach (var predicted in NliConfusionMatrix.Kinds)
            {
                text.Append(c, $" {evaluation.Confusion[gold, predicted],13}");
            }

            text.Append('\n');
        }

        return text.ToString();
    }

    /// <summary>One file gives one object; several give an array of them, in the order given.</summary>
    public static string Json(IReadOnlyList<(LabelledPairSet Pairs, NliEvaluation Evaluation)> evaluations) =>
        evaluations.Count == 1
            ? Json(evaluations[0].Pairs, evaluations[0].Evaluation)
            : "[\n" + string.Join(",\n", evaluations.Select(e => Json(e.Pairs, e.Evaluation).TrimEnd('\n'))) + "\n]\n";

    private static string Json(LabelledPairSet pairs, NliEvaluation evaluation) => JsonText.Object(json =>
    {
        json.WriteString("file", pairs.File);
        json.WriteString("model", evaluation.Model);
        json.WriteNumber("pairs", evaluation.Pairs);
        json.WriteNumber("skipped_unlabelled", pairs.SkippedUnlabelled);
        json.WriteNumber("truncated", evaluation.TruncatedPairs);
        json.WriteNumber("correct", evaluation.Correct);
        json.WriteNumber("accuracy", evaluation.Accuracy);
        json.WriteNullable("false_contradiction_rate", evaluation.FalseContradictionRate);
        json.WriteNumber("false_contradictions", evaluation.FalseContradictions);
        json.WriteNumber("calibration_error", evaluation.CalibrationError);
        json.WriteNumber("seconds", Math.Round(evaluation.Elapsed.TotalSeconds, 6));
        json.WriteNumber("pairs_per_second", Math.Round(evaluation.PairsPerSecond, 3));
        json.WriteStartArray("classes");
        foreach (var metrics in evaluation.Classes)
        {
            json.WriteStartObject();
            json.WriteString("label", NliCommand.LabelOf(metrics.Kind));
            json.WriteNullable("precision", metrics.Precision);
            json.WriteNullable("recall", metrics.Recall);
            json.WriteNumber("gold", metrics.Gold);
            json.WriteNumber("predicted", metrics.Predicted);
            json.WriteNumber("correct", metrics.Correct);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteStartObject("confusion");
        foreach (var gold in NliConfusionMatrix.Kinds)
        {
            json.WriteStartObject(NliCommand.LabelOf(gold));
            foreach (var predicted in NliConfusionMatrix.Kinds)
            {
                json.WriteNumber(NliCommand.LabelOf(predicted), evaluation.Confusion[gold, predicted]);
            }

            json.WriteEndObject();
        }

        json.WriteEndObject();
    });

    private static string Ratio(double? value) => value?.ToString("0.0000", CultureInfo.InvariantCulture) ?? "-";
}
