namespace Plumbline.Core.Language.Sources;

/// <summary>What every source kind is told when it is opened.</summary>
/// <param name="PromptVersion">The engine's prompt version (recordings and caches are tied to it).</param>
public sealed record ModelOpening(string PromptVersion);
