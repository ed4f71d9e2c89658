using System.Text;
using Plumbline.Application.Input;
using Plumbline.Application.Running;
using Plumbline.Application.Shards;
using Plumbline.Application.Tests.Doubles;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports;
using Plumbline.Reports.Json;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Tests.Shards;

public sealed class ShardMergeTests
{
    private static readonly RunSettings Settings = RunSettings.From(CoherenceOptions.Default, "scripted", "nli", "solver", seed: null);

    /// <summary>Twenty claims with gold labels; the scripted judge settles each with its gold label, except every
    /// third one, which it overturns (so the figures are not all trivially 1).</summary>
    private static ClaimInput Input(string name = "claims.jsonl", int count = 20) => ClaimInput.FromClaims(
        name, [.. Enumerable.Range(1, count).Select(i => new Claim($"q{i}", $"Claim {i}.", i % 2 == 0))]);

    private static readonly IClaimJudge Judge = new OverturningJudge();

    /// <summary>Runs the input (or one shard of it) and returns its JSON report, as a file would hold it.</summary>
    private static async Task<string> RunJsonAsync(ClaimInput input, IReadOnlyList<Gate>? gates = null, RunSettings? settings = null)
    {
        var run = new ClaimRun(Judge, settings ?? Settings, TimeProvider.System, new RunOptions("0.1.0", InFlight: 3));
        await using var store = new MemoryClaimStore();
        var outcome = await run.RunAsync(input, store, new SinkSet([], new CollectedDiagnostics()),
            gates is null ? null : figures => Gate.CheckAll(gates, figures), CancellationToken.None);
        using var buffer = new MemoryStream();
        await ReportWriterRegistry.Default.Create("json").WriteAsync(outcome.Report, buffer, CancellationToken.None);
        return Encoding.UTF8.GetString(buffer.ToArray());
    }

    private static async Task<List<ShardReport>> ShardsAsync(ClaimInput whole, int count, IReadOnlyList<Gate>? gates = null)
    {
        var shards = new List<ShardReport>();
        for (var k = 1; k <= count; k++)
        {
            var json = await RunJsonAsync(whole.Sharded(new ClaimShard(k, count)), gates);
            shards.Add(new ShardReport($"shard{k}.json", ReportJsonReader.Read(json, $"shard{k}.json")));
        }

        return shards;
    }

    private static async Task<string> JsonAsync(RunReport report)
    {
        using var buffer = new MemoryStream();
        await ReportWriterRegistry.Default.Create("json").WriteAsync(report, buffer, CancellationToken.None);
        return Encoding.UTF8.GetString(buffer.ToArray());
    }

    [Fact]
    public async Task Merge_ThreeShards_EqualsTheUnshardedRunTimingsAside()
    {
        using var whole = Input();
        Gate[] gates = [new(GateFigure.CoherentAccuracy, 0.6), new(GateFigure.OverturnRate, 0.2)];
        var unsharded = await RunJsonAsync(whole, gates);

        var merged = await ShardMerge.MergeAsync(await ShardsAsync(whole, 3, gates), gates: null, CancellationToken.None);

        Assert.Equal(ReportTimings.Without(unsharded), ReportTimings.Without(await JsonAsync(merged)));
        // Hand count: 20 claims, q3, q6 ... q18 overturned (6 of 20 = 0.3), so the overturn gate fails on the whole
        // run even though no single shard need fail it.
        Assert.Equal([true, false], merged.Gates.Select(g => g.Passed));
        Assert.Equal(0.3, merged.Figures.OverturnRate, 12);
        Assert.Equal(ExitCodes.GateFailed, ExitCodeDecision.Of(merged));
    }

    [Fact]
    public async Task Merge_GatesGiven_ReplaceTheShardsOwn()
    {
        using var whole = Input();

        var merged = await ShardMerge.MergeAsync(await ShardsAsync(whole, 2), [new Gate(GateFigure.OverturnRate, 0.3)], CancellationToken.None);

        Assert.Equal(("max_overturn_rate", true), (Assert.Single(merged.Gates).Name, merged.Gates[0].Passed));
    }

    [Fact]
    public async Task Merge_MoreShardsThanClaims_EmptyShardsStillMerge()
    {
        using var whole = Input(count: 2);

        var merged = await ShardMerge.MergeAsync(await ShardsAsync(whole, 5), gates: null, CancellationToken.None);

        Assert.Equal(2, merged.Figures.Claims);
        Assert.Null(merged.Header.Input!.Shard);
    }

    [Fact]
    public async Task Merge_ShardMissing_Refused()
    {
        using var whole = Input();
        var shards = await ShardsAsync(whole, 3);

        var error = await Assert.ThrowsAsync<UsageException>(() => ShardMerge.MergeAsync([shards[0], shards[2]], null, CancellationToken.None));

        Assert.Equal("merge: shard 2/3 of claims.jsonl missing", error.Message);
    }

    [Fact]
    public async Task Merge_ShardTwice_RefusedAsOverlap()
    {
        using var whole = Input();
        var shards = await ShardsAsync(whole, 2);
        var again = shards[1] with { File = "copy.json" };

        var error = await Assert.ThrowsAsync<UsageException>(() => ShardMerge.MergeAsync([.. shards, again], null, CancellationToken.None));

        Assert.Equal("copy.json: is shard 2/2 again (also shard2.json): the shards overlap", error.Message);
    }

    [Fact]
    public async Task Merge_ShardOfAnotherClaimFile_RefusedNamingTheFile()
    {
        using var whole = Input();
        using var other = Input("other.jsonl", count: 21);
        var shards = await ShardsAsync(whole, 2);
        var stranger = (await ShardsAsync(other, 2))[1] with { File = "other-shard2.json" };

        var error = await Assert.ThrowsAsync<UsageException>(() => ShardMerge.MergeAsync([shards[0], stranger], null, CancellationToken.None));

        Assert.StartsWith("other-shard2.json: judged another claim input (other.jsonl, sha256:", error.Message, StringComparison.Ordinal);
        Assert.Contains($"than shard1.json (claims.jsonl, {whole.Identity.Digest})", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Merge_OtherSettings_RefusedNamingThem()
    {
        using var whole = Input();
        var shards = await ShardsAsync(whole, 2);
        var json = await RunJsonAsync(whole.Sharded(new ClaimShard(2, 2)), settings: Settings with { ContestedThreshold = 0.5, ModelSource = "other" });
        var odd = new ShardReport("odd.json", ReportJsonReader.Read(json, "odd.json"));

        var error = await Assert.ThrowsAsync<UsageException>(() => ShardMerge.MergeAsync([shards[0], odd], null, CancellationToken.None));

        Assert.Equal("odd.json: used other settings than shard1.json: model_source, thresholds.contested_margin", error.Message);
    }

    [Fact]
    public async Task Merge_SplitDifferently_Refused()
    {
        using var whole = Input();
        var halves = await ShardsAsync(whole, 2);
        var thirds = await ShardsAsync(whole, 3);

        var error = await Assert.ThrowsAsync<UsageException>(() => ShardMerge.MergeAsync([halves[0], thirds[1]], null, CancellationToken.None));

        Assert.Equal("shard2.json: is shard 2/3, but shard1.json is shard 1/2: the input was split differently", error.Message);
    }

    [Fact]
    public async Task Merge_UnshardedReport_Refused()
    {
        using var whole = Input();
        var report = new ShardReport("all.json", ReportJsonReader.Read(await RunJsonAsync(whole), "all.json"));

        var error = await Assert.ThrowsAsync<UsageException>(() => ShardMerge.MergeAsync([report], null, CancellationToken.None));

        Assert.Equal("all.json: is not a shard report (it judged every claim; shards are run with --shard K/N)", error.Message);
    }

    /// <summary>Settles each claim with its gold label, but overturns every third claim to the other answer.</summary>
    private sealed class OverturningJudge : IClaimJudge
    {
        public Task<Verdict> JudgeAsync(Claim claim, CancellationToken cancellationToken)
        {
            var settled = ScriptedJudge.Settled(claim);
            var number = int.Parse(claim.Id[1..], System.Globalization.CultureInfo.InvariantCulture);
            return Task.FromResult(number % 3 == 0
                ? settled with { Answer = !settled.Answer, Status = ClaimStatus.Overturned }
                : settled);
        }
    }
}
