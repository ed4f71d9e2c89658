using System.Diagnostics;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.LoopbackEndpoint;
using Plumbline.Models.Http;
using Xunit;

namespace Plumbline.Models.Tests.Http;

/// <summary>Each injected fault is survived by a retry; a call whose every attempt fails says why; waits follow Retry-After.</summary>
public sealed class ResilienceTests
{
    private const string Statement = "Moss grows on stones.";

    private static AnswerRequest Ask() => new(Statement, PromptBook.Answer(Statement));

    [Theory]
    [InlineData(Fault.ServerError)]
    [InlineData(Fault.Unavailable)]
    [InlineData(Fault.Reset)]
    [InlineData(Fault.Slow)]
    [InlineData(Fault.MalformedJson)]
    [InlineData(Fault.MissingLogprobs)]
    [InlineData(Fault.TooManyRequests)]
    public async Task ScoreAnswers_OneFaultyResponse_IsRetried(Fault fault)
    {
        // The set-up check is request 1; the faults hit requests 2 and 3.
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(SlowBy: TimeSpan.FromSeconds(3))
        {
            Faults = (sequence, _) => sequence is 2 or 3 ? fault : Fault.None,
        });
        var opened = await Endpoint.OpenAsync(server, Endpoint.Options(calls: Endpoint.Quick(retries: 3, attemptSeconds: 0.5)));
        await using var model = opened.Model;

        var result = await model.ScoreAnswersAsync(Ask(), CancellationToken.None);

        Assert.Equal(new ScriptedAnswers().BeliefOf("Moss grows on stones"), result.True, 9);
        Assert.Equal(4, server.Requests);
        Assert.Equal([fault, fault], server.InjectedFaults);
    }

    [Fact]
    public async Task ScoreAnswers_EveryAttemptFails_GivesUpAfterTheBoundWithTheReason()
    {
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions
        {
            Faults = FaultPlans.Always("Moss grows", Fault.Unavailable, FaultPlans.None),
        });
        var opened = await Endpoint.OpenAsync(server, Endpoint.Options(calls: Endpoint.Quick(retries: 2)));
        await using var model = opened.Model;

        var error = await Assert.ThrowsAsync<ModelRequestException>(() => model.ScoreAnswersAsync(Ask(), CancellationToken.None));

        Assert.Equal(3, server.CountOf("Moss grows"));
        Assert.Contains("after 3 attempts", error.Message, StringComparison.Ordinal);
        Assert.Contains("503", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task RetryAfter_IsHonoured_UpToTheMaximumWait()
    {
        await using var server = await LoopbackModelServer.StartAsync(new LoopbackOptions(RetryAfterSeconds: 1)
        {
            Faults = (sequence, _) => sequence == 2 ? Fault.TooManyRequests : Fault.None,
        });
        var patient = Endpoint.Options(calls: new CallResilienceOptions(3, TimeSpan.FromMilliseconds(1), TimeSpan.FromSeconds(10), TimeSpan.FromSeconds(5)));
        var opened = await Endpoint.OpenAsync(server, patient);
        await using var model = opened.Model;

        var clock = Stopwatch.StartNew();
        await model.ScoreAnswersAsync(Ask(), CancellationToken.None);

        // Backoff alone would have waited about a millisecond.
        Assert.True(clock.Elapsed >= TimeSpan.FromMilliseconds(950), $"waited only {clock.Elapsed}");
    }

    [Fact]
    public async Task RequestsPerMinute_OnceTheMinutesAllowanceIsSpent_WaitsForRefills()
    {
        await using var server = await LoopbackModelServer.StartAsync();
        // 30 a minute: a bucket of 30, one more every 2 s. The set-up check is not counted.
        var limited = Endpoint.Options(calls: Endpoint.Quick() with { RequestsPerMinute = 30 });
        var opened = await Endpoint.OpenAsync(server, limited);
        await using var model = opened.Model;
        await Task.WhenAll(Enumerable.Range(0, 30).Select(i => model.ScoreAnswersAsync(new AnswerRequest($"s{i}", PromptBook.Answer($"s{i}")), CancellationToken.None)));

        // Three more need at least two refills, a full period apart, even if one came while the bucket was being spent.
        var clock = Stopwatch.StartNew();
        await Task.WhenAll(Enumerable.Range(0, 3).Select(i => model.ScoreAnswersAsync(new AnswerRequest($"more {i}", PromptBook.Answer($"more {i}")), CancellationToken.None)));

        Assert.True(clock.Elapsed >= TimeSpan.FromMilliseconds(1500), $"three requests over the allowance took only {clock.Elapsed}");
        Assert.Equal(34, server.Requests);
    }

    [Fact]
    public async Task TokensPerMinute_OnceSpent_WaitsForRefills()
    {
        await using var server = await LoopbackModelServer.StartAsync();
        // This 23-character prompt is estimated at 6 tokens (characters / 4, rounded down, plus the one answer
        // token); 360 a minute is a bucket of 360 (60 such requests) refilled by 6 a second, so three more
        // requests need three refills.
        const string prompt = "Q: s? True or False?\nA:";
        var limited = Endpoint.Options(calls: Endpoint.Quick() with { TokensPerMinute = 360 });
        var opened = await Endpoint.OpenAsync(server, limited);
        await using var model = opened.Model;
        await Task.WhenAll(Enumerable.Range(0, 60).Select(_ => model.ScoreAnswersAsync(new AnswerRequest("s", prompt), CancellationToken.None)));

        var clock = Stopwatch.StartNew();
        await Task.WhenAll(Enumerable.Range(0, 3).Select(_ => model.ScoreAnswersAsync(new AnswerRequest("s", prompt), CancellationToken.None)));

        Assert.True(clock.Elapsed >= TimeSpan.FromMilliseconds(1500), $"three requests over the allowance took only {clock.Elapsed}");
    }
}
