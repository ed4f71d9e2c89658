namespace Plumbline.Core.Coherence;

/// <summary>The prompt templates; bump <see cref="PromptVersion"/> whenever a template changes.</summary>
public static class PromptBook
{
    public const string PromptVersion = "1";
}
