using System.CommandLine;
using System.Globalization;
using System.Text;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Cli.Running;
using Plumbline.Core.Entailment;
using Plumbline.Nli;

namespace Plumbline.Cli.Commands;

/// <summary><c>plumb nli PREMISE HYPOTHESIS</c> scores one pair with the NLI model.</summary>
internal static class NliCommand
{
    private static readonly string[] Formats = ["text", "json"];

    public static Command Create(CliContext context)
    {
        var premise = new Argument<string?>("premise") { Description = "The premise sentence.", HelpName = "PREMISE", Arity = ArgumentArity.ZeroOrOne };
        var hypothesis = new Argument<string?>("hypothesis") { Description = "The hypothesis sentence.", HelpName = "HYPOTHESIS", Arity = ArgumentArity.ZeroOrOne };
        var nliModel = NliModelOption.Create();
        var output = new OutputOptions(Formats);
        var command = new Command("nli", "Score a premise/hypothesis pair with the NLI model.");
        command.Arguments.Add(premise);
        command.Arguments.Add(hypothesis);
        command.Options.Add(nliModel);
        output.AddTo(command);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var (p, h) = (parse.GetValue(premise), parse.GetValue(hypothesis));
            if (string.IsNullOrWhiteSpace(p) || string.IsNullOrWhiteSpace(h))
            {
                throw new UsageException("nli: give a premise and a hypothesis, both non-empty");
            }

            var settings = output.Read(parse);
            using var scorer = Backends.OpenScorer(NliModelOption.Read(parse, nliModel));
            var result = (await scorer.ScoreWithDetailsAsync([new SentencePair(p, h)], cancellationToken))[0];
            var text = settings.Format == "json" ? PairJson(p, h, result) : PairText(p, h, result);
            await ResultDestination.WriteTextAsync(settings.Path, context.Output, text, cancellationToken);
            return ExitCodes.Success;
        }, cancellationToken));
        return command;
    }

    internal static string LabelOf(EntailmentKind kind) => kind.ToString().ToLowerInvariant();

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
