using System.Globalization;
using System.Text;
using Plumbline.Application.Running;
using Plumbline.Core.Coherence;
using Plumbline.Core.Trees;
using Plumbline.Solver.Wcnf;

namespace Plumbline.Application.Sinks;

/// <summary>
/// Writes each judged claim's MAX-SAT problem as WCNF, named after the claim id, with comment lines that say which
/// statement each variable stands for. Solving the file gives the verdict's objective cost. A failed claim has no
/// problem and writes nothing. A write that fails is a problem of the run, never a lost verdict.
/// </summary>
public sealed class WcnfExportSink : IRunSink
{
    private readonly string folder;
    private readonly HashSet<string> names = new(StringComparer.Ordinal);

    private WcnfExportSink(string folder) => this.folder = folder;

    public string Name => $"wcnf export to {folder}";

    /// <summary>Creates the folder now, so that a bad path stops the run before anything is spent.</summary>
    /// <exception cref="UsageException">The folder cannot be created.</exception>
    public static WcnfExportSink Open(string folder)
    {
        try
        {
            Directory.CreateDirectory(folder);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or NotSupportedException or ArgumentException)
        {
            throw new UsageException($"--export-wcnf: cannot create folder '{folder}': {e.Message}");
        }

        return new WcnfExportSink(folder);
    }

    public Task RunStartedAsync(RunStarted started, CancellationToken cancellationToken) => Task.CompletedTask;

    public Task VerdictReadyAsync(VerdictReady ready, CancellationToken cancellationToken) => WriteAsync(ready.Verdict, cancellationToken);

    public Task RunFinishedAsync(RunFinished finished, CancellationToken cancellationToken) => Task.CompletedTask;

    /// <summary>Writes the verdict's problem; returns the file written, or null for a failed claim.</summary>
    public async Task<string?> WriteAsync(Verdict verdict, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(verdict);
        if (verdict.Problem is not { } problem || verdict.Tree is not { } tree)
        {
            return null;
        }

        var path = Path.Combine(folder, UniqueName(verdict.Claim.Id) + ".wcnf");
        await WcnfWriter.WriteFileAsync(path, problem.Problem, Comments(verdict, problem, tree), cancellationToken);
        return path;
    }

    /// <summary>A file name from the id: characters unsafe in a file name become '_', and a name met twice gets a suffix.</summary>
    internal string UniqueName(string id)
    {
        var builder = new StringBuilder(id.Length);
        foreach (var c in id)
        {
            builder.Append(char.IsAsciiLetterOrDigit(c) || c is '-' or '_' or '.' ? c : '_');
        }

        var stem = builder.Length == 0 || builder[0] == '.' ? "_" + builder : builder.ToString();
        var name = stem;
        for (var n = 2; !names.Add(name); n++)
        {
            name = string.Create(CultureInfo.InvariantCulture, $"{stem}-{n}");
        }

        return name;
    }

    private static List<string> Comments(Verdict verdict, CoherenceProblem problem, ExplanationTree tree)
    {
        var comments = new List<string>
        {
            $"plumb claim {verdict.Claim.Id}: {verdict.Claim.Text}",
            string.Create(CultureInfo.InvariantCulture,
                $"weights are clause weights x {problem.Scale}; optimum cost {verdict.ObjectiveCost}, answer {Describe(verdict.Answer)}"),
        };
        for (var v = 1; v <= problem.StatementOfVariable.Count; v++)
        {
            var statement = tree[problem.StatementOfVariable[v - 1]];
            comments.Add(string.Create(CultureInfo.InvariantCulture, $"variable {v} = statement #{statement.Id}: {statement.Text}"));
        }

        return comments;
    }

    private static string Describe(bool? answer) => answer switch
    {
        true => "true",
        false => "false",
        null => "none",
    };
}
