using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using Plumbline.LoopbackEndpoint;

namespace Plumbline.Cli.Tests.EndToEnd.Live;

/// <summary>
/// plumb judging a live model: a real OpenAI-compatible server on 127.0.0.1 that counts requests and
/// injects faults, plumb as a separate process with the shipped NLI model and the real solver.
/// </summary>
public sealed class LiveModelTests
{
    [Fact]
    public async Task Sweep_TwentyPercentFaultyResponses_JudgesEveryClaimWithinTheRetryBound()
    {
        const string doomed = "Doomed claim number 1 holds.";
        using var run = new LiveRun(49);
        var claims = run.WriteClaims("fifty.jsonl",
            Enumerable.Range(1, 49).Select(i => (LiveRun.Id(i), LiveRun.Claim("Invented claim", i))).Append(("doomed", doomed)));
        var faults = FaultPlans.Always("Doomed claim", Fault.Unavailable, FaultPlans.Random(0.2, seed: 7,
            Fault.TooManyRequests, Fault.ServerError, Fault.Unavailable, Fault.Reset, Fault.Slow, Fault.MalformedJson, Fault.MissingLogprobs));
        // Retry-After: 0 keeps the many 429s quick; that the wait is honoured is checked on its own in the Models tests.
        // A slow answer comes after 5 s, well past the 2 s each attempt gets; 2 s is long enough that a busy
        // machine does not turn a 503 into a timeout.
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(SlowBy: TimeSpan.FromSeconds(5), RetryAfterSeconds: 0)
        {
            Faults = (n, p) => n == 1 ? Fault.None : faults(n, p),
        });
        var report = run.File("report.json");

        var result = await run.RunAsync(run.Sweep(server, report, claims, null, "--retries", "6", "--retry-delay", "0.01", "--call-timeout", "2"));

        Assert.True(result.ExitCode == 3, result.ToString());
        using var json = JsonDocument.Parse(await File.ReadAllTextAsync(report));
        var ids = ReportJson.Ids(json);
        Assert.Equal(50, ids.Count);
        Assert.Equal("failed", ReportJson.Status(json, "doomed"));
        var error = ClaimError(json, "doomed");
        Assert.Contains("after 7 attempts: 503", error, StringComparison.Ordinal);
        // The injected faults really happened, every kind of them, and no request was sent more than 1 + 6 times.
        Assert.True(server.InjectedFaults.Count > 150, $"only {server.InjectedFaults.Count} faults injected");
        Assert.True(server.InjectedFaults.Distinct().Count() == 7, string.Join(", ", server.InjectedFaults.GroupBy(f => f).Select(g => $"{g.Key} x{g.Count()}")));
        Assert.All(server.RequestsByPrompt.Where(p => !p.Key.Contains("Is water wet", StringComparison.Ordinal)), p => Assert.InRange(p.Value, 1, 7));
        // The doomed claim's first request (its negation) was tried 1 + 6 times; then the claim stopped.
        Assert.Equal(7, server.CountOf("Doomed claim"));
        // Claims other than the doomed one fail only by exhausting their retries too, with the reason.
        foreach (var id in ids.Where(i => i != "doomed" && ReportJson.Status(json, i) == "failed"))
        {
            Assert.Contains("after 7 attempts", ClaimError(json, id), StringComparison.Ordinal);
        }
    }

    [Fact]
    public async Task Sweep_KeyInTheEnvironment_AppearsInNoOutputReportOrCacheFile()
    {
        var key = "sk-plumb-" + Guid.NewGuid().ToString("N");
        using var run = new LiveRun(3);
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(RequiredKey: key)
        {
            // At most 2 faults per prompt, under the 4 retries a call gets: with a plain 20% rate a prompt
            // faulted 5 times in a row (about 2% of runs over ~70 prompts) failed the run for a reason this
            // test is not about.
            Faults = FaultPlans.AtMostPerPrompt(2, FaultPlans.Random(0.2, seed: 3, Fault.ServerError, Fault.TooManyRequests, Fault.MalformedJson)),
            RetryAfterSeconds = 0,
        });
        var report = run.File("report.json");

        var judged = await run.RunAsync(run.Sweep(server, report, more: ["--retry-delay", "0.01"]), key);
        // A second run whose key the endpoint refuses: the error names the variable, never the value.
        var refused = await run.RunAsync(run.Sweep(server, run.File("refused.json"), more: ["--retry-delay", "0.01"]), key + "x");

        Assert.True(judged.ExitCode == 0, judged.ToString());
        Assert.Equal(2, refused.ExitCode);
        Assert.Contains("PLUMB_API_KEY", refused.Error, StringComparison.Ordinal);
        Assert.Contains("Bearer " + key, server.Authorizations);
        // The key went out on retried requests too.
        Assert.True(server.InjectedFaults.Count > 5, $"only {server.InjectedFaults.Count} faults injected");
        var keyBytes = Encoding.UTF8.GetBytes(key);
        Assert.DoesNotContain(key, judged.Output + judged.Error + refused.Output + refused.Error, StringComparison.Ordinal);
        var files = Directory.GetFiles(run.Folder, "*", SearchOption.AllDirectories);
        Assert.Contains(files, f => f.EndsWith(".sqlite", StringComparison.Ordinal));
        Assert.Contains(files, f => f.EndsWith("report.json", StringComparison.Ordinal));
        foreach (var file in files)
        {
            var bytes = await File.ReadAllBytesAsync(file);
            Assert.True(bytes.AsSpan().IndexOf(keyBytes) < 0, $"the key is in {file}");
        }
    }

    [Fact]
    public async Task Sweep_KilledMidRunThenRerun_ResendsNoFinishedCallAndGivesTheSameReport()
    {
        using var run = new LiveRun(10);
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(Delay: TimeSpan.FromMilliseconds(40)));
        var baseline = run.File("baseline.json");
        var uninterrupted = await run.RunAsync(run.Sweep(server, baseline, cacheDir: run.File("baseline-cache")));
        Assert.True(uninterrupted.ExitCode == 0, uninterrupted.ToString());
        var total = server.Requests;

        var report = run.File("report.json");
        int beforeKill;
        using (var killed = PlumbProcess.Start(run.Folder, run.Environment(), run.Sweep(server, report)))
        {
            var waited = System.Diagnostics.Stopwatch.StartNew();
            while (server.Requests - total < total / 2 && waited.Elapsed < TimeSpan.FromMinutes(2))
            {
                await Task.Delay(20);
            }

            killed.Kill();
            beforeKill = server.Requests - total;
        }

        Assert.False(File.Exists(report));
        var rerun = await run.RunAsync(run.Sweep(server, report));
        var afterKill = server.Requests - total - beforeKill;

        Assert.True(rerun.ExitCode == 0, rerun.ToString());
        // Every request of the killed run that had been answered is served from the cache: the two runs
        // together send the uninterrupted run's requests, plus one more set-up check, plus at most the
        // calls that were in flight when the process died (at most the concurrent-calls cap).
        Assert.InRange(beforeKill + afterKill, total + 1, total + 1 + Options.ModelOptions.DefaultConcurrentCalls);
        Assert.True(afterKill < total, $"the rerun sent {afterKill} requests of {total}");
        Assert.True(JsonNode.DeepEquals(LiveRun.WithoutTimes(baseline), LiveRun.WithoutTimes(report)), "the reports differ");
    }

    [Fact]
    public async Task Sweep_TwoProcessesSharingTheCache_LoseNothing()
    {
        using var run = new LiveRun(7);
        var first = run.WriteClaims("first.jsonl", Enumerable.Range(1, 5).Select(i => (LiveRun.Id(i), LiveRun.Claim("Invented claim", i))));
        var second = run.WriteClaims("second.jsonl", Enumerable.Range(3, 5).Select(i => (LiveRun.Id(i), LiveRun.Claim("Invented claim", i))));
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(Delay: TimeSpan.FromMilliseconds(5)));

        using var a = PlumbProcess.Start(run.Folder, run.Environment(), run.Sweep(server, run.File("a.json"), first));
        using var b = PlumbProcess.Start(run.Folder, run.Environment(), run.Sweep(server, run.File("b.json"), second));
        var results = await Task.WhenAll(a.WaitAsync(TimeSpan.FromMinutes(5)), b.WaitAsync(TimeSpan.FromMinutes(5)));
        Assert.All(results, r => Assert.True(r.ExitCode == 0, r.ToString()));
        var sent = server.Requests;

        var all = await run.RunAsync(run.Sweep(server, run.File("all.json")));

        Assert.True(all.ExitCode == 0, all.ToString());
        // Everything the seven claims need was stored by one process or the other: only the set-up check goes out.
        Assert.Equal(sent + 1, server.Requests);
        Assert.Contains("cache: ", all.Error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task CacheExportedToARecording_ReplaysTheSameVerdicts()
    {
        using var run = new LiveRun(4);
        await using var server = await LoopbackModelServer.StartAsync();
        var live = run.File("live.json");
        Assert.Equal(0, (await run.RunAsync(run.Sweep(server, live))).ExitCode);
        var recording = run.File("nightly.jsonl");

        var export = await run.RunAsync(["cache", "export", recording, "--cache-dir", run.CacheDir]);
        var replay = await run.RunAsync(["sweep", run.ClaimFile, "--model", "recording:" + recording, "--format", "json", "-o", run.File("replay.json")]);

        Assert.True(export.ExitCode == 0, export.ToString());
        Assert.True(replay.ExitCode == 0, replay.ToString());
        var liveClaims = LiveRun.WithoutTimes(live)["claims"]!;
        var replayedClaims = LiveRun.WithoutTimes(run.File("replay.json"))["claims"]!;
        Assert.Equal(4, liveClaims.AsArray().Count);
        Assert.True(JsonNode.DeepEquals(liveClaims, replayedClaims), "replayed verdicts differ from the live run's");
    }

    [Fact]
    public async Task Sweep_CallBudgetSpent_StopsWithExitThreeAndNamesTheClaimsNotJudged()
    {
        using var run = new LiveRun(3);
        await using var server = await LoopbackModelServer.StartAsync();
        var report = run.File("report.json");

        // One claim at a time, so the budget is met in the second claim: the first takes 23 calls (root: a
        // negation and two answers; two abductions of three; six negations and twelve answers).
        var stopped = await run.RunAsync(run.Sweep(server, report, more: ["--max-calls", "30", "--in-flight", "1"]));

        Assert.True(stopped.ExitCode == 3, stopped.ToString());
        Assert.True(stopped.Error.Contains("the budget of 30 model calls is spent", StringComparison.Ordinal), stopped.ToString());
        using var json = JsonDocument.Parse(await File.ReadAllTextAsync(report));
        Assert.Equal(["k01"], ReportJson.Ids(json));
        var completion = json.RootElement.GetProperty("completion");
        Assert.Equal("the budget of 30 model calls is spent", completion.GetProperty("stopped_because").GetString());
        Assert.Equal(["k02", "k03"], completion.GetProperty("not_judged").EnumerateArray().Select(e => e.GetString()));
        Assert.Equal(31, server.Requests);

        // Rerun with room: the 30 answered calls come from the cache, only the rest go out.
        var resumed = await run.RunAsync(run.Sweep(server, report, more: ["--in-flight", "1"]));
        Assert.True(resumed.ExitCode == 0, resumed.ToString());
        Assert.Equal(31 + 1 + (3 * 23) - 30, server.Requests);
    }

    private static string ClaimError(JsonDocument report, string id) =>
        report.RootElement.GetProperty("claims").EnumerateArray().Single(c => c.GetProperty("id").GetString() == id).GetProperty("error").GetString()!;
}
