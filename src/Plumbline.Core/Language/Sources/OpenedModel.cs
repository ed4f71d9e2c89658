namespace Plumbline.Core.Language.Sources;

/// <summary>A model source, opened and checked.</summary>
/// <param name="Model">The model; the caller disposes it.</param>
/// <param name="Identity">Who answers, for cache keys.</param>
/// <param name="Cacheable">True when answers cost time or money and are worth keeping in the response cache
/// (a live endpoint or local model); false for a source that is already a store of answers.</param>
/// <param name="Notices">One-line notes for the user found while opening (such as beliefs estimated by votes).</param>
public sealed record OpenedModel(ILanguageModel Model, ModelIdentity Identity, bool Cacheable, IReadOnlyList<string> Notices)
{
    public static OpenedModel Stored(ILanguageModel model, ModelIdentity identity) => new(model, identity, false, []);
}
