namespace Plumbline.Models.Http;

/// <summary>Which OpenAI-compatible route a request goes to.</summary>
public enum HttpApi
{
    /// <summary><c>POST {base}/chat/completions</c>, the prompt sent as one user message.</summary>
    Chat,

    /// <summary><c>POST {base}/completions</c>, the prompt sent as it is.</summary>
    Completions,
}
