namespace Plumbline.Core.Language;

/// <summary>Tokens a backend reports for one call (zero when it cannot tell).</summary>
public readonly record struct TokenUsage(int PromptTokens, int CompletionTokens)
{
    public static TokenUsage None => default;

    public int Total => PromptTokens + CompletionTokens;

    public static TokenUsage operator +(TokenUsage a, TokenUsage b) =>
        new(a.PromptTokens + b.PromptTokens, a.CompletionTokens + b.CompletionTokens);
}
