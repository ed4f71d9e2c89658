using System.CommandLine;
using Plumbline.Core.Runs;

namespace Plumbline.Cli.Options;

/// <summary>
/// One option per gate, spelled after the gate's name (<c>min_coherent_accuracy</c> is <c>--min-coherent-accuracy</c>).
/// Accuracies and rates are shares from 0 to 1, failed claims a count, the mean margin in clause-weight units.
/// </summary>
internal sealed class GateOptions
{
    private readonly (Gate Kind, Option<double?> Option)[] options;

    public GateOptions()
    {
        options = [.. Gate.Names.Select(name => Gate.Named(name, 0)!).Select(kind => (kind, Create(kind)))];
    }

    /// <summary>The option of each gate, in <see cref="Gate.Names"/> order.</summary>
    public IEnumerable<Option<double?>> All => options.Select(o => o.Option);

    public static string OptionName(string gateName) => "--" + gateName.Replace('_', '-');

    public void AddTo(Command command)
    {
        foreach (var option in All)
        {
            command.Options.Add(option);
        }
    }

    /// <summary>The gates given, in <see cref="Gate.Names"/> order.</summary>
    public IReadOnlyList<Gate> Read(ParseResult parse) =>
        [.. options.Where(o => parse.GetValue(o.Option) is not null).Select(o => o.Kind with { Threshold = parse.GetValue(o.Option)!.Value })];

    private static Option<double?> Create(Gate kind)
    {
        var name = OptionName(kind.Name);
        var (help, wanted, accept) = kind.Figure switch
        {
            GateFigure.FailedClaims => (
                "Gate: at most N claims may fail (with this gate set, failed claims no longer make the run incomplete on their own).",
                "a number of claims (a whole number 0 or more)",
                (Func<double, bool>)(v => v >= 0 && v == Math.Floor(v))),
            GateFigure.MeanMargin => ("Gate: the mean margin of judged claims must be at least MARGIN.", "a margin (a number 0 or more)", v => v >= 0),
            _ => ($"Gate: the {Describe(kind.Figure)} must be {(kind.AtLeast ? "at least" : "at most")} SHARE (0 to 1).",
                "a share (a number from 0 to 1)", v => v is >= 0 and <= 1),
        };
        var option = new Option<double?>(name)
        {
            Description = help,
            HelpName = kind.Figure switch { GateFigure.FailedClaims => "N", GateFigure.MeanMargin => "MARGIN", _ => "SHARE" },
        };
        option.CustomParser = result => NumberParsing.Parse(result, name, wanted, accept);
        return option;
    }

    private static string Describe(GateFigure figure) => figure switch
    {
        GateFigure.CoherentAccuracy => "coherent accuracy (answers that match gold labels)",
        GateFigure.CoherentLowerBound => "lower end of the coherent accuracy's Wilson 95% interval",
        GateFigure.DirectAccuracy => "direct accuracy (direct answers that match gold labels)",
        GateFigure.OverturnRate => "overturn rate",
        GateFigure.ContestedRate => "contested rate",
        _ => figure.ToString(),
    };
}
