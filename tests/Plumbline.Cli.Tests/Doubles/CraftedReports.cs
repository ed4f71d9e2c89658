using System.Text;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.Reports;
using Plumbline.Reports.Model;

namespace Plumbline.Cli.Tests.Doubles;

/// <summary>Hand-built JSON reports of invented runs: each claim only its gold label, answer and status, written through the real JSON writer.</summary>
internal static class CraftedReports
{
    public static RunSettings Settings { get; } = RunSettings.From(CoherenceOptions.Default, "recording:demo.jsonl", "nli sha256:0123", "cp-sat", seed: null);

    /// <summary>A claim as the crafted reports hold it; a null answer makes it failed.</summary>
    public sealed record Row(string Id, bool? Gold, bool? Answer, ClaimStatus Status = ClaimStatus.Settled, double Margin = 1.0);

    public static async Task<string> WriteAsync(string path, IReadOnlyList<Row> rows, RunSettings? settings = null, string digest = "sha256:1111111111111111111111111111111111111111111111111111111111111111")
    {
        var claims = rows.Select((r, i) => new ClaimReport(
            r.Id, $"Invented claim {r.Id}.", r.Gold, [], r.Answer, r.Answer, r.Answer is null ? ClaimStatus.Failed : r.Status, r.Margin, false, false,
            [], [], [], [], [], r.Answer is null ? null : SolveStatus.Optimal, r.Answer is null ? null : 0, 0, 0, 5, TokenUsage.None, VerdictTimings.None,
            r.Answer is null ? "claim failed" : null) { Position = i + 1 }).ToList();
        var tally = new RunTally();
        claims.ForEach(c => tally.Add(c.Tally()));
        var started = new DateTimeOffset(2026, 1, 5, 2, 0, 0, TimeSpan.Zero);
        var header = RunHeader.Create("0.1.0", settings ?? Settings, started) with { Input = new RunInput("claims.jsonl", rows.Count, digest, null) };
        var report = new RunReport(header, started.AddMinutes(3), tally.ToFigures(TimeSpan.FromMinutes(3)), [], RunCompletion.Complete, new ClaimReportList(claims));
        await using var file = File.Create(path);
        await ReportWriterRegistry.Default.Create("json").WriteAsync(report, file, CancellationToken.None);
        return path;
    }

    public static string Text(params string[] lines) => string.Join('\n', lines) + "\n";

    public static Encoding Utf8 { get; } = new UTF8Encoding(false);
}
