using System.CommandLine;
using System.CommandLine.Parsing;
using Plumbline.Application;
using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Core.Claims;
using Plumbline.Reports;

namespace Plumbline.Cli.Options;

/// <summary>The options <c>check</c> and <c>sweep</c> share: model source, NLI model, engine settings, reports and how the run behaves.</summary>
internal sealed class JudgeOptions
{
    private readonly Option<string?> exportWcnf = new("--export-wcnf")
    {
        Description = "Write each judged claim's MAX-SAT problem to DIR/<claim id>.wcnf.",
        HelpName = "DIR",
    };

    private readonly Option<string[]> report = new("--report")
    {
        Description = "Write a report: FORMAT (text, json, jsonl, md, html, junit) to standard output, or FORMAT:PATH to a file. Repeat for several.",
        HelpName = "FORMAT[:PATH]",
        AllowMultipleArgumentsPerToken = false,
    };

    private readonly Option<bool> verbose = new("--verbose", "-v")
    {
        Description = "List every statement pair with both directions' NLI scores, not only the linked ones.",
    };

    private readonly Option<bool> quiet = new("--quiet", "-q")
    {
        Description = "No progress on standard error (errors are still shown).",
    };

    private readonly Option<bool> debug = new("--debug")
    {
        Description = "Show the stack trace of an unexpected error.",
    };

    private readonly Option<int> inFlight = new("--in-flight")
    {
        Description = "Claims judged at once; reports still list them in input order.",
        HelpName = "N",
        DefaultValueFactory = _ => RunOptions.DefaultInFlight,
    };

    private readonly Option<bool> strictInput = new("--strict-input")
    {
        Description = "Stop before judging anything when a claim line is bad (by default bad lines are reported and skipped).",
    };

    private readonly Option<string?> junitFailures = new("--junit-fail-on")
    {
        Description = "What fails a claim's JUnit test case, comma-separated: overturned, gold (answer disagrees with gold), contested, failed.",
        HelpName = "LIST",
        DefaultValueFactory = _ => "overturned,gold,failed",
    };

    private readonly Option<ClaimShard?> shard = new("--shard")
    {
        Description = "Judge only shard K of N (K from 1 to N): the claims whose id's SHA-256 falls there. Run every K, then plumb merge.",
        HelpName = "K/N",
        CustomParser = result =>
        {
            try
            {
                return ClaimShard.Parse(result.Tokens.Count > 0 ? result.Tokens[^1].Value : "");
            }
            catch (FormatException e)
            {
                result.AddError("--shard: " + e.Message);
                return null;
            }
        },
    };

    private readonly EngineOptions engine = new();

    private readonly Option<Core.Trees.TreeShape?> treeWidths = TreeShapeOption.Create();

    private readonly IReadOnlyList<string> formats;

    public JudgeOptions(IReadOnlyList<string> reportFormats)
    {
        formats = reportFormats;
        NliModel = NliModelOption.Create();
        Model = new ModelOptions();
        Output = new OutputOptions(reportFormats);
        Gates = new GateOptions();
        inFlight.Validators.Add(result =>
        {
            if (result.GetValueOrDefault<int>() < 1)
            {
                result.AddError("--in-flight: give a number of claims, 1 or more");
            }
        });
    }

    public Option<string?> NliModel { get; }

    public ModelOptions Model { get; }

    public OutputOptions Output { get; }

    public GateOptions Gates { get; }

    public void AddTo(Command command)
    {
        Model.AddTo(command);
        command.Options.Add(NliModel);
        engine.AddTo(command);
        command.Options.Add(treeWidths);
        command.Options.Add(exportWcnf);
        Output.AddTo(command);
        command.Options.Add(report);
        command.Options.Add(verbose);
        command.Options.Add(quiet);
        command.Options.Add(debug);
        command.Options.Add(inFlight);
        command.Options.Add(strictInput);
        command.Options.Add(junitFailures);
        command.Options.Add(shard);
        Gates.AddTo(command);
    }

    /// <summary>Adds the claim-format option, which only a command reading a claim file has.</summary>
    public Option<string> ClaimsFormatOption { get; } = CreateClaimsFormat();

    /// <exception cref="UsageException">A value cannot work (unknown model source, output folder missing ...).</exception>
    public JudgeSettings Read(ParseResult parse)
    {
        var source = Model.Read(parse);
        var engine = this.engine.Read(parse);
        if (parse.GetValue(treeWidths) is { } shape)
        {
            engine = engine with { Shape = shape };
        }

        var export = parse.GetValue(exportWcnf);
        if (export is { Length: 0 })
        {
            throw new UsageException("--export-wcnf: the folder name is empty");
        }

        var claimsFormat = parse.GetResult(ClaimsFormatOption) is null
            ? ClaimFileFormat.Auto
            : ClaimFormats.Of(parse.GetValue(ClaimsFormatOption)!);
        return new JudgeSettings(source, NliModelOption.Read(parse, NliModel), engine, export, ReportTargets(parse))
        {
            Verbose = parse.GetValue(verbose),
            Quiet = parse.GetValue(quiet),
            Debug = parse.GetValue(debug),
            InFlight = parse.GetValue(inFlight),
            StrictInput = parse.GetValue(strictInput),
            ClaimsFormat = claimsFormat,
            JunitFailures = JunitFailuresOf(parse.GetValue(junitFailures)!),
            Seed = source.Seed,
            Gates = Gates.Read(parse),
            Shard = parse.GetValue(shard),
        };
    }

    /// <summary>
    /// The reports asked for: every <c>--report</c>, plus the <c>--format</c>/<c>-o</c> shorthand when it was given
    /// (or when nothing else was: text to standard output). Paths are checked now, so a finished run is never lost
    /// to an unwritable destination.
    /// </summary>
    private List<ReportTarget> ReportTargets(ParseResult parse)
    {
        var targets = new List<ReportTarget>();
        foreach (var spec in parse.GetValue(report) ?? [])
        {
            var colon = spec.IndexOf(':', StringComparison.Ordinal);
            var format = (colon < 0 ? spec : spec[..colon]).Trim().ToLowerInvariant();
            var path = colon < 0 ? null : spec[(colon + 1)..];
            if (!formats.Contains(format))
            {
                throw new UsageException($"--report: unknown format '{format}' in '{spec}' (known: {string.Join(", ", formats)})");
            }

            targets.Add(new ReportTarget(format, path is null ? null : OutputOptions.CheckPath("--report", path)));
        }

        var shorthandGiven = parse.GetResult(Output.Format) is { Implicit: false } || parse.GetResult(Output.Output) is not null;
        if (targets.Count == 0 || shorthandGiven)
        {
            var output = Output.Read(parse);
            targets.Add(new ReportTarget(output.Format, output.Path));
        }

        if (targets.Count(t => t.Path is null) > 1)
        {
            throw new UsageException("--report: only one report can go to standard output; give the others a path (FORMAT:PATH)");
        }

        var twice = targets.Where(t => t.Path is not null).GroupBy(t => Path.GetFullPath(t.Path!)).FirstOrDefault(g => g.Count() > 1);
        if (twice is not null)
        {
            throw new UsageException($"--report: two reports would write '{twice.First().Path}'");
        }

        return targets;
    }

    private static JunitFailures JunitFailuresOf(string list)
    {
        var failures = JunitFailures.None;
        foreach (var word in list.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries))
        {
            failures |= word.ToLowerInvariant() switch
            {
                "overturned" => JunitFailures.Overturned,
                "gold" => JunitFailures.Gold,
                "contested" => JunitFailures.Contested,
                "failed" => JunitFailures.Failed,
                "none" => JunitFailures.None,
                _ => throw new UsageException($"--junit-fail-on: unknown condition '{word}' (known: overturned, gold, contested, failed, none)"),
            };
        }

        return failures;
    }

    private static Option<string> CreateClaimsFormat()
    {
        var option = new Option<string>("--claims-format")
        {
            Description = "Layout of the claim input: auto (by extension; standard input by its first line), jsonl, csv or text.",
            HelpName = "FORMAT",
            DefaultValueFactory = _ => "auto",
        };
        option.AcceptOnlyFromAmong(ClaimFormats.Names);
        return option;
    }
}

/// <summary>Command-line spellings of the claim input formats.</summary>
internal static class ClaimFormats
{
    public static readonly string[] Names = ["auto", "jsonl", "csv", "text"];

    public static ClaimFileFormat Of(string name) => name switch
    {
        "jsonl" => ClaimFileFormat.JsonLines,
        "csv" => ClaimFileFormat.Csv,
        "text" => ClaimFileFormat.PlainText,
        _ => ClaimFileFormat.Auto,
    };
}
