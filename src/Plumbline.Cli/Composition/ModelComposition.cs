using Plumbline.Cli.Options;
using Plumbline.Core.Language;
using Plumbline.Core.Language.Sources;
using Plumbline.LocalModel;
using Plumbline.Models.Cache;
using Plumbline.Models.Http;
using Plumbline.Models.Limits;
using Plumbline.Models.Recording;

namespace Plumbline.Cli.Composition;

/// <summary>
/// Registers the model source kinds and builds the model a run talks to: the opened source inside a
/// global cap on calls in flight, inside the budget, inside the response cache (outermost, so cached
/// answers take no slot and cost no budget). A new kind of source is one more entry in <see cref="Registry"/>.
/// </summary>
internal static class ModelComposition
{
    public static ModelSourceRegistry Registry(ModelSettings settings, Func<string, string?> environment, TimeProvider time) => new(
    [
        new RecordingSourceKind(),
        new HttpSourceKind(settings.Http, environment, time),
        new LocalSourceKind(new LocalModelOptions(Threads: settings.ModelThreads, Seed: settings.Seed)),
    ]);

    /// <summary>Opens and checks the source through the registry (a file is read, an endpoint gets one small request).</summary>
    /// <exception cref="ModelSourceException">The source cannot be used.</exception>
    public static Task<OpenedModel> OpenAsync(
        ModelSettings settings, string promptVersion, Func<string, string?> environment, TimeProvider time, CancellationToken cancellationToken) =>
        Registry(settings, environment, time).OpenAsync(settings.Source, new ModelOpening(promptVersion), cancellationToken);

    /// <summary>Wraps an opened source in the run's decorators, opening the cache when the source is worth caching.
    /// The composed model owns the source: disposing it disposes the source, also when this throws.</summary>
    /// <exception cref="ResponseCacheException">The cache file cannot be used.</exception>
    public static async Task<ComposedModel> ComposeAsync(
        OpenedModel opened, ModelSettings settings, string promptVersion, Func<string, string?> environment, TimeProvider time, CancellationToken cancellationToken)
    {
        ResponseCache? cache = null;
        try
        {
            ILanguageModel model = new CappedLanguageModel(opened.Model, settings.ConcurrentCalls);
            var budget = settings.MaxCalls is null && settings.MaxTokens is null ? null : new CallBudget(settings.MaxCalls, settings.MaxTokens);
            if (budget is not null)
            {
                model = new BudgetedLanguageModel(model, budget);
            }

            CachedLanguageModel? cached = null;
            if (opened.Cacheable && settings.Cache.Enabled)
            {
                cache = await ResponseCache.OpenAsync(settings.Cache.FilePath(environment), time, cancellationToken);
                model = cached = new CachedLanguageModel(model, cache, opened.Identity, promptVersion, settings.Cache.Mode);
            }

            return new ComposedModel(model, opened, cache, cached, budget);
        }
        catch
        {
            if (cache is not null)
            {
                await cache.DisposeAsync();
            }

            await opened.Model.DisposeAsync();
            throw;
        }
    }
}

/// <summary>The model of a run with its decorators, and what they have to say at the end.</summary>
internal sealed class ComposedModel(ILanguageModel model, OpenedModel opened, ResponseCache? cache, CachedLanguageModel? cached, CallBudget? budget)
    : IAsyncDisposable
{
    public ILanguageModel Model => model;

    public ModelIdentity Identity => opened.Identity;

    public IReadOnlyList<string> Notices => opened.Notices;

    public CallBudget? Budget => budget;

    /// <summary>One line on what the cache did ("cache: 40 answers served, 12 stored in FILE"), or null without a cache.</summary>
    public string? CacheSummary()
    {
        if (cached is null || cache is null)
        {
            return null;
        }

        var line = $"cache: {cached.Hits} answers served, {cached.Stored} stored in {cache.FilePath}";
        return cached.StoreFailure is { } failure ? $"{line}; some answers could not be stored ({failure})" : line;
    }

    public async ValueTask DisposeAsync()
    {
        await model.DisposeAsync();
        if (cache is not null)
        {
            await cache.DisposeAsync();
        }
    }
}
