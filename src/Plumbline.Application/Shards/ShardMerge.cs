using System.Globalization;
using Plumbline.Core.Runs;
using Plumbline.Reports.Json;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Shards;

/// <summary>
/// Combines the reports of every shard of one claim input into the report the unsharded run would have written:
/// claims back in input order (by their positions), figures recomputed from them, gates checked again on those
/// figures; only the timing fields differ (the merge starts with the earliest shard and finishes with the latest).
/// It refuses, naming the file, reports that cannot make one run: not shard reports, of another claim input, other
/// settings or another plumb version, a shard given twice, a shard missing, a claim in two shards.
/// </summary>
public static class ShardMerge
{
    /// <summary>Merges <paramref name="shards"/>; <paramref name="gates"/> replace the shards' own gates when given.</summary>
    /// <exception cref="UsageException">The reports do not make one run; the message names the file and the problem.</exception>
    public static async Task<RunReport> MergeAsync(IReadOnlyList<ShardReport> shards, IReadOnlyList<Gate>? gates, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(shards);
        if (shards.Count == 0)
        {
            throw new UsageException("merge: give the shard reports to merge");
        }

        var first = shards[0];
        var input = InputOf(first);
        var settings = SettingsEntries.Of(first.Report.Header);
        var byIndex = new Dictionary<int, ShardReport>();
        foreach (var shard in shards)
        {
            var header = shard.Report.Header;
            var shardInput = InputOf(shard);
            if (shardInput.Digest != input.Digest || shardInput.Claims != input.Claims)
            {
                throw Refused(shard, $"judged another claim input ({shardInput.Name}, {shardInput.Digest}) than {first.File} ({input.Name}, {input.Digest})");
            }

            if (shardInput.Shard!.Count != input.Shard!.Count)
            {
                throw Refused(shard, $"is shard {shardInput.Shard}, but {first.File} is shard {input.Shard}: the input was split differently");
            }

            if (header.ToolVersion != first.Report.Header.ToolVersion)
            {
                throw Refused(shard, $"was written by plumb {header.ToolVersion}, {first.File} by plumb {first.Report.Header.ToolVersion}");
            }

            var differences = SettingsEntries.Differences(first.Report.Header, header, judgingOnly: false);
            if (differences.Count > 0)
            {
                throw Refused(shard, $"used other settings than {first.File}: {string.Join(", ", differences.Select(d => d.Key))}");
            }

            if (!byIndex.TryAdd(shardInput.Shard.Index, shard))
            {
                throw Refused(shard, $"is shard {shardInput.Shard} again (also {byIndex[shardInput.Shard.Index].File}): the shards overlap");
            }
        }

        var missing = Enumerable.Range(1, input.Shard!.Count).Where(k => !byIndex.ContainsKey(k)).ToList();
        if (missing.Count > 0)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"merge: shard{(missing.Count == 1 ? "" : "s")} {string.Join(", ", missing.Select(k => $"{k}/{input.Shard.Count}"))} of {input.Name} missing"));
        }

        var claims = await ClaimsInOrderAsync(shards, input, cancellationToken);
        var started = shards.Min(s => s.Report.Header.Started);
        var finished = shards.Max(s => s.Report.Finished);
        var tally = new RunTally();
        claims.ForEach(c => tally.Add(c.Tally()));
        var figures = tally.ToFigures(finished - started);
        var header0 = first.Report.Header with { Started = started, Input = input with { Shard = null } };
        return new RunReport(header0, finished, figures, Gate.CheckAll(gates ?? GatesOf(shards), figures), CompletionOf(shards), new ClaimReportList(claims));
    }

    private static RunInput InputOf(ShardReport shard) => shard.Report.Header.Input switch
    {
        null => throw Refused(shard, "records no claim input (written before reports could be merged); run the shard again"),
        { Shard: null } => throw Refused(shard, "is not a shard report (it judged every claim; shards are run with --shard K/N)"),
        var input => input,
    };

    /// <summary>Every claim once, in input order; every claim of the input either judged in some shard or listed as not judged.</summary>
    private static async Task<List<ClaimReport>> ClaimsInOrderAsync(IReadOnlyList<ShardReport> shards, RunInput input, CancellationToken cancellationToken)
    {
        var owner = new Dictionary<string, string>(StringComparer.Ordinal);
        var claims = new List<ClaimReport>();
        foreach (var shard in shards)
        {
            await foreach (var claim in shard.Report.Claims.ReadAsync(cancellationToken))
            {
                if (claim.Position is null)
                {
                    throw Refused(shard, $"claim '{claim.Id}' has no position in the input");
                }

                if (!owner.TryAdd(claim.Id, shard.File))
                {
                    throw Refused(shard, $"claim '{claim.Id}' is also in {owner[claim.Id]}: the shards overlap");
                }

                claims.Add(claim);
            }

            foreach (var id in shard.Report.Completion.NotJudged)
            {
                if (!owner.TryAdd(id, shard.File))
                {
                    throw Refused(shard, $"claim '{id}' is also in {owner[id]}: the shards overlap");
                }
            }
        }

        if (owner.Count != input.Claims)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                $"merge: the shards account for {owner.Count} of the {input.Claims} claims of {input.Name}"));
        }

        claims.Sort((a, b) => a.Position!.Value.CompareTo(b.Position!.Value));
        return claims;
    }

    /// <summary>The shards' gates, which must be the same in every shard (they were set by one command line or config).</summary>
    private static List<Gate> GatesOf(IReadOnlyList<ShardReport> shards)
    {
        static string Key(RunReport report) => string.Join(';', report.Gates.Select(g => string.Create(CultureInfo.InvariantCulture, $"{g.Name}{g.Comparison}{g.Threshold:R}")));
        var first = shards[0];
        if (shards.FirstOrDefault(s => Key(s.Report) != Key(first.Report)) is { } other)
        {
            throw Refused(other, $"checked other gates than {first.File}; give the gates to merge instead");
        }

        return [.. first.Report.Gates.Select(g => Gate.Named(g.Name, g.Threshold) ?? throw Refused(first, $"unknown gate '{g.Name}'"))];
    }

    private static RunCompletion CompletionOf(IReadOnlyList<ShardReport> shards)
    {
        var stopped = shards
            .Where(s => s.Report.Completion.StoppedBecause is not null)
            .Select(s => $"shard {s.Report.Header.Input!.Shard}: {s.Report.Completion.StoppedBecause}")
            .ToList();
        return new RunCompletion(
            stopped.Count == 0 ? null : string.Join("; ", stopped),
            [.. shards.SelectMany(s => s.Report.Completion.NotJudged)],
            // Each shard read the whole input, so each lists the same bad input lines: keep one of each.
            [.. shards.SelectMany(s => s.Report.Completion.Problems).Distinct()]);
    }

    private static UsageException Refused(ShardReport shard, string problem) => new($"{shard.File}: {problem}");
}
