using System.CommandLine;
using Plumbline.Core.Coherence;

namespace Plumbline.Cli.Options;

/// <summary>The options <c>check</c> and <c>sweep</c> share: model source, NLI model, engine settings, export and output.</summary>
internal sealed class JudgeOptions
{
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
        Model = new ModelOptions();
        Output = new OutputOptions(reportFormats);
        negation.AcceptOnlyFromAmong(EngineChoices.Negations);
        weighting.AcceptOnlyFromAmong(EngineChoices.Weightings);
        contestedAt.CustomParser = result => NumberParsing.Parse(result, "--contested-at", "a margin (a number 0 or more)", v => v >= 0);
    }

    public Option<string?> NliModel { get; }

    public ModelOptions Model { get; }

    public OutputOptions Output { get; }

    public void AddTo(Command command)
    {
        Model.AddTo(command);
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
        var source = Model.Read(parse);
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

        return new JudgeSettings(source, NliModelOption.Read(parse, NliModel), engine, export, output);
    }
}
