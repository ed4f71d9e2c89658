namespace Plumbline.Core.Language;

/// <summary>The texts a model wrote for one request, and the tokens it spent.</summary>
public sealed record GenerationResult(IReadOnlyList<string> Texts, TokenUsage Usage);
