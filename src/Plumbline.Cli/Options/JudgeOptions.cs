using System.CommandLine;

namespace Plumbline.Cli.Options;

/// <summary>The options <c>check</c> and <c>sweep</c> share: model source, NLI model, engine settings, export and output.</summary>
internal sealed class JudgeOptions
{
    private readonly Option<string?> model = new(ModelSource.OptionName)
    {
        Description = "Where the model's answers come from: recording:PATH replays a recording file.",
        HelpName = "SOURCE",
    };

    private readonly Option<string?> exportWcnf = new("--export-wcnf")
    {
        Description = "Write each judged claim's MAX-SAT problem to DIR/<claim id>.wcnf.",
        HelpName = "DIR",
    };

    private readonly EngineOptions engine = new();

    public JudgeOptions(IReadOnlyList<string> reportFormats)
    {
        NliModel = NliModelOption.Create();
        Output = new OutputOptions(reportFormats);
    }

    public Option<string?> NliModel { get; }

    public OutputOptions Output { get; }

    public void AddTo(Command command)
    {
        command.Options.Add(model);
        command.Options.Add(NliModel);
        engine.AddTo(command);
        command.Options.Add(exportWcnf);
        Output.AddTo(command);
    }

    /// <exception cref="UsageException">A value cannot work (unknown model source, output folder missing ...).</exception>
    public JudgeSettings Read(ParseResult parse)
    {
        var source = ModelSource.Parse(parse.GetValue(model));
        var output = Output.Read(parse);
        var engine = this.engine.Read(parse);
        var export = parse.GetValue(exportWcnf);
        if (export is { Length: 0 })
        {
            throw new UsageException("--export-wcnf: the folder name is empty");
        }

        return new JudgeSettings(source, NliModelOption.Read(parse, NliModel), engine, export, output);
    }
}
