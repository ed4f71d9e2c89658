namespace Plumbline.Core.Language;

/// <summary>How the model should decode a generation: sampling (temperature / nucleus) or greedy.</summary>
public sealed record Decoding(double Temperature, double TopP, int MaxTokens, IReadOnlyList<string> Stop)
{
    public static Decoding Greedy(int maxTokens = 64) => new(0.0, 1.0, maxTokens, ["\n"]);

    public static Decoding Sampling(double topP = 1.0, double temperature = 1.0, int maxTokens = 64) =>
        new(temperature, topP, maxTokens, ["\n"]);

    public bool IsGreedy => Temperature <= 0.0;
}
