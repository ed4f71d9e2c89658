using System.CommandLine;
using System.Globalization;
using System.Text;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Cli.Running;
using Plumbline.Core.Entailment;
using Plumbline.Nli;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Cli.Commands;

/// <summary>
/// <c>plumb nli PREMISE HYPOTHESIS</c> scores one pair with the NLI model; <c>plumb nli --eval FILE...</c> measures
/// the model on each file of labelled pairs (CSV, TSV or JSON Lines), loading it once.
/// </summary>
internal static class NliCommand
{
    private static readonly string[] Formats = ["text", "json"];

    public static Command Create(CliContext context, CompositionRoot root)
    {
        var premise = new Argument<string?>("premise") { Description = "The premise sentence.", HelpName = "PREMISE", Arity = ArgumentArity.ZeroOrOne };
        var hypothesis = new Argument<string?>("hypothesis") { Description = "The hypothesis sentence.", HelpName = "HYPOTHESIS", Arity = ArgumentArity.ZeroOrOne };
        var eval = new Option<string[]>("--eval")
        {
            Description = "Evaluate the model on labelled pairs, per file: .csv, .tsv or .jsonl with premise, hypothesis and label fields.",
            HelpName = "FILE",
            AllowMultipleArgumentsPerToken = true,
        };
        var nliModel = NliModelOption.Create();
        var output = new OutputOptions(Formats);
        var command = new Command("nli", "Score a premise/hypothesis pair with the NLI model, or evaluate it on labelled pairs.");
        command.Arguments.Add(premise);
        command.Arguments.Add(hypothesis);
        command.Options.Add(eval);
        command.Options.Add(nliModel);
        output.AddTo(command);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var (p, h, evalFiles) = (parse.GetValue(premise), parse.GetValue(hypothesis), parse.GetValue(eval) ?? []);
            var settings = output.Read(parse);
            string text;
            if (evalFiles.Length > 0)
            {
                if (p is not null || h is not null)
                {
                    throw new UsageException("nli: give either a premise and a hypothesis, or --eval FILE..., not both");
                }

                // Every file is read before the model loads, so a bad row in the last file costs no scoring.
                var sets = evalFiles.Select(ReadPairs).ToArray();
                using var scorer = root.OpenNliModel(NliModelOption.Read(parse, nliModel));
                var evaluations = new List<(LabelledPairSet Pairs, NliEvaluation Evaluation)>();
                foreach (var pairs in sets)
                {
                    evaluations.Add((pairs, await NliEvaluator.EvaluateAsync(scorer, pairs.Pairs, root.Time, cancellationToken)));
                }

                text = settings.Format == "json" ? NliEvaluationOutput.Json(evaluations) : NliEvaluationOutput.Text(evaluations);
            }
            else
            {
                if (string.IsNullOrWhiteSpace(p) || string.IsNullOrWhiteSpace(h))
                {
                    throw new UsageException("nli: give a premise and a hypothesis, both non-empty (or --eval FILE...)");
                }

                using var scorer = root.OpenNliModel(NliModelOption.Read(parse, nliModel));
                var result = (await scorer.ScoreWithDetailsAsync([new SentencePair(p, h)], cancellationToken))[0];
                text = settings.Format == "json" ? PairJson(p, h, result) : PairText(p, h, result);
            }

            await ResultDestination.WriteTextAsync(settings.Path, context.Output, text, cancellationToken);
            return ExitCodes.Success;
        }, cancellationToken));
        return command;
    }

    internal static string LabelOf(EntailmentKind kind) => kind.ToString().ToLowerInvariant();

    /// <exception cref="UsageException">The file is missing or holds no labelled pair.</exception>
    /// <exception cref="LabelledPairFormatException">A row is malformed.</exception>
    private static LabelledPairSet ReadPairs(string path)
    {
        if (!File.Exists(path))
        {
            throw new UsageException($"--eval: {path}: file not found");
        }

        var pairs = LabelledPairReader.Read(path);
        return pairs.Pairs.Count > 0
            ? pairs
            : throw new UsageException($"--eval: {path}: no labelled pair ({pairs.SkippedUnlabelled} unlabelled row(s) skipped)");
    }

    private static string PairText(string premise, string hypothesis, NliPairResult result)
    {
        var s = result.Scores;
        var text = new StringBuilder();
        void Row(string name, string value) => text.Append(CultureInfo.InvariantCulture, $"{name,-14} {value}\n");
        Row("premise", premise);
        Row("hypothesis", hypothesis);
        Row("entailment", s.Entailment.ToString("0.0000", CultureInfo.InvariantCulture));
        Row("neutral", s.Neutral.ToString("0.0000", CultureInfo.InvariantCulture));
        Row("contradiction", s.Contradiction.ToString("0.0000", CultureInfo.InvariantCulture));
        Row("label", LabelOf(s.Kind));
        if (result.Truncated)
        {
            Row("note", "the pair was cut to the model's maximum length");
        }

        return text.ToString();
    }

    private static string PairJson(string premise, string hypothesis, NliPairResult result) => JsonText.Object(json =>
    {
        json.WriteString("premise", premise);
        json.WriteString("hypothesis", hypothesis);
        json.WriteNumber("entailment", result.Scores.Entailment);
        json.WriteNumber("neutral", result.Scores.Neutral);
        json.WriteNumber("contradiction", result.Scores.Contradiction);
        json.WriteString("label", LabelOf(result.Scores.Kind));
        json.WriteBoolean("truncated", result.Truncated);
    });
}
