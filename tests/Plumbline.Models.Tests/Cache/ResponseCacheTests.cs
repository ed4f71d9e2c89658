using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Models.Cache;
using Plumbline.Models.Recording;
using Plumbline.Models.Tests.Recording;
using Xunit;

namespace Plumbline.Models.Tests.Cache;

/// <summary>The SQLite response cache on real files.</summary>
public sealed class ResponseCacheTests : IDisposable
{
    private static readonly ModelIdentity Alpha = new("http", "alpha", [new("endpoint", "http://127.0.0.1:1/v1")]);
    private static readonly ModelIdentity Beta = new("http", "beta", [new("endpoint", "http://127.0.0.1:1/v1")]);
    private readonly TempDirectory folder = new();

    public void Dispose() => folder.Dispose();

    private string CachePath => folder.File("cache/responses.sqlite");

    private static GenerationRequest Abduction(string subject, int sample = 0) =>
        new(GenerationPurpose.Abduction, subject, true, PromptBook.Abduction(subject, true), Decoding.Sampling(), 2, sample);

    private static AnswerRequest Answer(string statement) => new(statement, PromptBook.Answer(statement));

    [Fact]
    public async Task Generate_SecondTime_IsServedFromTheCacheWithItsOriginalUsage()
    {
        var inner = new CountingModel();
        await using (var cache = await ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None))
        {
            var model = new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion);
            var first = await model.GenerateAsync(Abduction("Owls hunt at night."), CancellationToken.None);
            var again = await model.GenerateAsync(Abduction("Owls hunt at night."), CancellationToken.None);

            Assert.Equal(first.Texts, again.Texts);
            Assert.Equal(first.Usage, again.Usage);
            Assert.Equal(1, inner.Calls);
            Assert.Equal(1, model.Hits);
        }

        // A new process (here: a new cache object) finds it too.
        await using var reopened = await ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None);
        var later = new CachedLanguageModel(inner, reopened, Alpha, PromptBook.PromptVersion);
        await later.GenerateAsync(Abduction("Owls hunt at night."), CancellationToken.None);
        Assert.Equal(1, inner.Calls);
    }

    [Fact]
    public async Task Key_IncludesIdentitySampleIndexAndPrompt()
    {
        var inner = new CountingModel();
        await using var cache = await ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None);
        var alpha = new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion);
        var beta = new CachedLanguageModel(inner, cache, Beta, PromptBook.PromptVersion);

        await alpha.GenerateAsync(Abduction("Owls hunt at night."), CancellationToken.None);
        await beta.GenerateAsync(Abduction("Owls hunt at night."), CancellationToken.None);
        await alpha.GenerateAsync(Abduction("Owls hunt at night.", sample: 1), CancellationToken.None);
        await alpha.GenerateAsync(Abduction("Owls hunt at night.") with { Prompt = "another template" }, CancellationToken.None);
        await alpha.ScoreAnswersAsync(Answer("Owls hunt at night."), CancellationToken.None);

        Assert.Equal(5, inner.Calls);
        Assert.Equal(0, alpha.Hits + beta.Hits);
    }

    [Fact]
    public async Task Refresh_AsksAgainAndOverwrites()
    {
        var inner = new CountingModel();
        await using var cache = await ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None);
        await new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion).ScoreAnswersAsync(Answer("Rain is wet."), CancellationToken.None);
        var refreshing = new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion, CacheMode.Refresh);

        var fresh = await refreshing.ScoreAnswersAsync(Answer("Rain is wet."), CancellationToken.None);
        var served = await new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion).ScoreAnswersAsync(Answer("Rain is wet."), CancellationToken.None);

        Assert.Equal(2, inner.Calls);
        Assert.Equal(fresh, served);
        Assert.Equal(1, await cache.CountAsync(CancellationToken.None));
    }

    [Fact]
    public async Task Open_TextFile_IsNotACache()
    {
        Directory.CreateDirectory(Path.GetDirectoryName(CachePath)!);
        await File.WriteAllTextAsync(CachePath, "these are my notes, not a cache\n");

        var error = await Assert.ThrowsAsync<ResponseCacheException>(() => ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None));

        Assert.Contains("is not a Plumbline response cache (not an SQLite database)", error.Message, StringComparison.Ordinal);
        Assert.Equal("these are my notes, not a cache\n", await File.ReadAllTextAsync(CachePath));
    }

    [Fact]
    public async Task Open_OtherSqliteDatabase_IsNotACache()
    {
        Directory.CreateDirectory(Path.GetDirectoryName(CachePath)!);
        await using (var other = new Microsoft.Data.Sqlite.SqliteConnection($"Data Source={CachePath};Pooling=False"))
        {
            await other.OpenAsync();
            await using var command = other.CreateCommand();
            command.CommandText = "CREATE TABLE invoices(id INTEGER)";
            await command.ExecuteNonQueryAsync();
        }

        var error = await Assert.ThrowsAsync<ResponseCacheException>(() => ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None));

        Assert.Contains("SQLite database of something else", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task ExportThenImport_RoundTripsThroughTheRecordingFormat()
    {
        var inner = new CountingModel();
        var recording = folder.File("exported.jsonl");
        GenerationResult texts;
        AnswerProbabilities belief;
        await using (var cache = await ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None))
        {
            var model = new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion);
            texts = await model.GenerateAsync(Abduction("Owls hunt at night.", sample: 2), CancellationToken.None);
            belief = await model.ScoreAnswersAsync(Answer("Owls hunt at night."), CancellationToken.None);
            var identity = await cache.ResolveAsync(Alpha.Key[..8], CancellationToken.None);
            Assert.Equal(2, await cache.ExportAsync(identity.Key, recording, CancellationToken.None));
        }

        // The recording replays exactly what was cached...
        var replay = await RecordingLanguageModel.LoadAsync(recording, PromptBook.PromptVersion, CancellationToken.None);
        Assert.Equal(texts.Texts, (await replay.GenerateAsync(Abduction("Owls hunt at night.", sample: 2), CancellationToken.None)).Texts);
        Assert.Equal(belief, await replay.ScoreAnswersAsync(Answer("Owls hunt at night."), CancellationToken.None));

        // ...and imported into a fresh cache under another identity, it is served without a call.
        await using var fresh = await ResponseCache.OpenAsync(folder.File("fresh.sqlite"), TimeProvider.System, CancellationToken.None);
        Assert.Equal(2, await fresh.ImportAsync(recording, Beta, PromptBook.PromptVersion, CancellationToken.None));
        var served = new CachedLanguageModel(inner, fresh, Beta, PromptBook.PromptVersion);
        Assert.Equal(belief, await served.ScoreAnswersAsync(Answer("Owls hunt at night."), CancellationToken.None));
        Assert.Equal(texts.Texts, (await served.GenerateAsync(Abduction("Owls hunt at night.", sample: 2), CancellationToken.None)).Texts);
        Assert.Equal(2, inner.Calls);
    }

    [Fact]
    public async Task ConcurrentStores_AreAllKept()
    {
        var inner = new CountingModel();
        await using var cache = await ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None);
        var model = new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion);

        await Task.WhenAll(Enumerable.Range(0, 300).Select(i => model.ScoreAnswersAsync(Answer($"Statement {i}."), CancellationToken.None)));

        Assert.Equal(300, await cache.CountAsync(CancellationToken.None));
        Assert.Equal(300, model.Stored);
    }

    [Fact]
    public async Task InspectAndPrune_WorkPerIdentity()
    {
        var inner = new CountingModel();
        await using var cache = await ResponseCache.OpenAsync(CachePath, TimeProvider.System, CancellationToken.None);
        await new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion).ScoreAnswersAsync(Answer("A."), CancellationToken.None);
        await new CachedLanguageModel(inner, cache, Alpha, PromptBook.PromptVersion).GenerateAsync(Abduction("A."), CancellationToken.None);
        await new CachedLanguageModel(inner, cache, Beta, PromptBook.PromptVersion).ScoreAnswersAsync(Answer("B."), CancellationToken.None);

        var listed = await cache.InspectAsync(CancellationToken.None);
        var alpha = Assert.Single(listed, i => i.Key == Alpha.Key);
        Assert.Equal((1, 1), (alpha.Generations, alpha.Answers));
        Assert.Equal(Alpha.CanonicalJson, alpha.Identity);

        Assert.Equal(2, await cache.PruneAsync(Alpha.Key, null, CancellationToken.None));
        Assert.Equal(Beta.Key, Assert.Single(await cache.InspectAsync(CancellationToken.None)).Key);
    }

    [Fact]
    public void DefaultDirectory_FollowsXdgThenHome()
    {
        Assert.Equal("/x/cache/plumbline", CacheDirectory.Default(n => n == "XDG_CACHE_HOME" ? "/x/cache" : "/home/u"));
        Assert.Equal("/home/u/.cache/plumbline", CacheDirectory.Default(n => n == "HOME" ? "/home/u" : null));
        // A relative XDG_CACHE_HOME is ignored, as the base directory convention says.
        Assert.Equal("/home/u/.cache/plumbline", CacheDirectory.Default(n => n == "XDG_CACHE_HOME" ? "rel" : "/home/u"));
    }

    /// <summary>Answers from a counter, so every real call gives a different response.</summary>
    private sealed class CountingModel : ILanguageModel
    {
        private int calls;

        public int Calls => Volatile.Read(ref calls);

        public string Describe => "counting";

        public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
        {
            var n = Interlocked.Increment(ref calls);
            return Task.FromResult(new GenerationResult([.. Enumerable.Range(0, request.Count).Select(i => $"text {n}.{i} \"quoted\" é")], new TokenUsage(10 + n, 5)));
        }

        public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
        {
            var n = Interlocked.Increment(ref calls);
            return Task.FromResult(AnswerProbabilities.FromRaw(1.0 / (n + 2), 1 - 1.0 / (n + 2), usage: new TokenUsage(n, 1)));
        }
    }
}
