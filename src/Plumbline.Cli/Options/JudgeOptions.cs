using System.CommandLine;
using Plumbline.Core.Coherence;

namespace Plumbline.Cli.Options;

/// <summary>The options <c>check</c> and <c>sweep</c> share: model source, NLI model, engine settings, export and output.</summary>
internal sealed class JudgeOptions
{
    private readonly Option<string?> model = new(ModelSource.OptionName)
    {
        Description = "Where the model's answers come from: recording:PATH replays a recording file; onnx:DIR runs a decoder-only ONNX model folder in this process.",
        HelpName = "SOURCE",
    };

    private readonly Option<int?> seed = new("--seed")
    {
        Description = "Sampling seed: the same seed gives the same sampled explanations (onnx:DIR).",
        HelpName = "N",
    };

    private readonly Option<int?> modelThreads = new("--model-threads")
    {
        Description = "CPU threads for each run of a local model (onnx:DIR); default: every core.",
        HelpName = "N",
    };

    private readonly Option<string?> negation = new("--negation")
    {
        Description = "How statements are negated for the integrity test: model (the model rewrites them) or prefix (\"It is not true that ...\").",
        HelpName = "MODE",
        DefaultValueFactory = _ => "model",
    };

    private readonly Option<string?> weighting = new("--weighting")
    {
        Description = "Weight of a link's clause: unit (1) or nli (the NLI probability).",
        HelpName = "MODE",
        DefaultValueFactory = _ => "unit",
    };

    private readonly Option<double> contestedAt = new("--contested-at")
    {
        Description = "A margin at or below this makes a claim contested.",
        HelpName = "MARGIN",
        DefaultValueFactory = _ => CoherenceOptions.Default.ContestedThreshold,
    };

    private readonly Option<string?> exportWcnf = new("--export-wcnf")
    {
        Description = "Write each judged claim's MAX-SAT problem to DIR/<claim id>.wcnf.",
        HelpName = "DIR",
    };

    public JudgeOptions(IReadOnlyList<string> reportFormats)
    {
        NliModel = NliModelOption.Create();
        Output = new OutputOptions(reportFormats);
        negation.AcceptOnlyFromAmong(EngineChoices.Negations);
        weighting.AcceptOnlyFromAmong(EngineChoices.Weightings);
        contestedAt.CustomParser = result => NumberParsing.Parse(result, "--contested-at", "a margin (a number 0 or more)", v => v >= 0);
    }

    public Option<string?> NliModel { get; }

    public OutputOptions Output { get; }

    public void AddTo(Command command)
    {
        command.Options.Add(model);
        command.Options.Add(seed);
        command.Options.Add(modelThreads);
        command.Options.Add(NliModel);
        command.Options.Add(negation);
        command.Options.Add(weighting);
        command.Options.Add(contestedAt);
        command.Options.Add(exportWcnf);
        Output.AddTo(command);
    }

    /// <exception cref="UsageException">A value cannot work (unknown model source, output folder missing ...).</exception>
    public JudgeSettings Read(ParseResult parse)
    {
        var source = ModelSource.Parse(parse.GetValue(model));
        var threads = parse.GetValue(modelThreads);
        if (threads is < 1)
        {
            throw new UsageException("--model-threads: give 1 or more");
        }

        if (source is LocalModelSource local)
        {
            source = local with { Threads = threads, Seed = parse.GetValue(seed) };
        }
        else if (threads is not null)
        {
            throw new UsageException("--model-threads: only a local model (--model onnx:DIR) runs here");
        }

        var output = Output.Read(parse);
        var engine = CoherenceOptions.Default with
        {
            Negation = EngineChoices.NegationOf(parse.GetValue(negation)!),
            Weighting = EngineChoices.WeightingOf(parse.GetValue(weighting)!),
            ContestedThreshold = parse.GetValue(contestedAt),
        };
        var export = parse.GetValue(exportWcnf);
        if (export is { Length: 0 })
        {
            throw new UsageException("--export-wcnf: the folder name is empty");
        }

        return new JudgeSettings(source, NliModelOption.Read(parse, NliModel), engine, export, output, parse.GetValue(seed));
    }
}
