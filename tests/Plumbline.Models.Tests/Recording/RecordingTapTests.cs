using Plumbline.Core.Language;
using Plumbline.Models.Recording;
using Xunit;

namespace Plumbline.Models.Tests.Recording;

public sealed class RecordingTapTests : IDisposable
{
    private readonly TempDirectory temp = new();

    public void Dispose() => temp.Dispose();

    /// <summary>Test double for a live, sampling model: every call gives new texts.</summary>
    private sealed class SamplingModel(int extraTexts = 0, bool fail = false) : ILanguageModel
    {
        private int calls;

        public int Calls => calls;

        public string Describe => "fake:sampler";

        public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
        {
            var call = Interlocked.Increment(ref calls);
            if (fail)
            {
                throw new ModelRequestException("backend down");
            }

            var texts = Enumerable.Range(0, request.Count + extraTexts).Select(i => $"{request.Subject} call {call} text {i}").ToArray();
            return Task.FromResult(new GenerationResult(texts, new TokenUsage(10, 5)));
        }

        public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
        {
            var call = Interlocked.Increment(ref calls);
            return Task.FromResult(AnswerProbabilities.FromRaw(call, 10, usage: new TokenUsage(3, 1)));
        }
    }

    [Fact]
    public async Task Tap_LiveRunThenReplay_ReplayGivesWhatTheRunSaw()
    {
        var path = temp.File("live.jsonl");
        var live = new SamplingModel();
        var abduction = Requests.Abduction("Bats are mammals.", true, 3);
        var answer = Requests.Answer("Bats are mammals.");
        GenerationResult seen;
        AnswerProbabilities seenAnswer;

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            var tap = new RecordingTap(live, writer);
            seen = await tap.GenerateAsync(abduction, CancellationToken.None);
            seenAnswer = await tap.ScoreAnswersAsync(answer, CancellationToken.None);
            Assert.Equal("fake:sampler", tap.Describe);
        }

        var replay = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);
        Assert.Equal(seen.Texts, (await replay.GenerateAsync(abduction, CancellationToken.None)).Texts);
        Assert.Equal(seen.Usage, (await replay.GenerateAsync(abduction, CancellationToken.None)).Usage);
        Assert.Equal(seenAnswer, await replay.ScoreAnswersAsync(answer, CancellationToken.None));
    }

    [Fact]
    public async Task Tap_SameRequestTwice_FirstResponseReturnedAndWrittenOnce()
    {
        var path = temp.File("live.jsonl");
        var live = new SamplingModel();
        var request = Requests.Abduction("Bats are mammals.", true, 2);

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            var tap = new RecordingTap(live, writer);
            var first = await tap.GenerateAsync(request, CancellationToken.None);
            var second = await tap.GenerateAsync(request with { Prompt = "re-rendered" }, CancellationToken.None);
            Assert.Equal(first.Texts, second.Texts);
            var firstAnswer = await tap.ScoreAnswersAsync(Requests.Answer("S."), CancellationToken.None);
            var secondAnswer = await tap.ScoreAnswersAsync(Requests.Answer("S."), CancellationToken.None);
            Assert.Same(firstAnswer, secondAnswer);
            Assert.Equal(3 / 13.0, secondAnswer.True, 12);
        }

        Assert.Equal(4, live.Calls);
        Assert.Equal(2, (await File.ReadAllLinesAsync(path)).Length);
        var replay = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);
        Assert.Equal(2, replay.Count);
    }

    [Fact]
    public async Task Tap_ModelGivesMoreTextsThanN_RunAndRecordingGetFirstN()
    {
        var path = temp.File("live.jsonl");
        var request = Requests.Abduction("Bats are mammals.", false, 2);

        GenerationResult seen;
        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            seen = await new RecordingTap(new SamplingModel(extraTexts: 2), writer).GenerateAsync(request, CancellationToken.None);
        }

        Assert.Equal(["Bats are mammals. call 1 text 0", "Bats are mammals. call 1 text 1"], seen.Texts);
        var replay = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);
        Assert.Equal(seen.Texts, (await replay.GenerateAsync(request, CancellationToken.None)).Texts);
        Assert.DoesNotContain("text 2", await File.ReadAllTextAsync(path), StringComparison.Ordinal);
    }

    [Fact]
    public async Task Tap_ModelGivesTooFewTexts_ModelRequestExceptionAndNothingWritten()
    {
        var path = temp.File("live.jsonl");

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            var error = await Assert.ThrowsAsync<ModelRequestException>(() =>
                new RecordingTap(new SamplingModel(extraTexts: -1), writer)
                    .GenerateAsync(Requests.Abduction("Bats are mammals.", true, 3), CancellationToken.None));
            Assert.Equal("fake:sampler returned 2 texts where 3 were asked for (abduction of \"Bats are mammals.\")", error.Message);
        }

        Assert.Equal("", await File.ReadAllTextAsync(path));
    }

    [Fact]
    public async Task Tap_ModelFails_ErrorPassesThroughAndNothingWritten()
    {
        var path = temp.File("live.jsonl");

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            var error = await Assert.ThrowsAsync<ModelRequestException>(() =>
                new RecordingTap(new SamplingModel(fail: true), writer)
                    .GenerateAsync(Requests.Negation("Bats can fly."), CancellationToken.None));
            Assert.Equal("backend down", error.Message);
        }

        Assert.Equal("", await File.ReadAllTextAsync(path));
    }

    [Fact]
    public async Task Tap_ConcurrentRequests_EveryDistinctRequestRecordedOnce()
    {
        var path = temp.File("live.jsonl");
        var live = new SamplingModel();

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            var tap = new RecordingTap(live, writer);
            await Parallel.ForEachAsync(Enumerable.Range(0, 400), new ParallelOptions { MaxDegreeOfParallelism = 8 }, async (k, ct) =>
                await tap.GenerateAsync(Requests.Abduction($"Statement {k % 50}.", true, 1), ct));
        }

        Assert.Equal(50, (await File.ReadAllLinesAsync(path)).Length);
        var replay = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);
        Assert.Equal(50, replay.Count);
    }
}
