namespace Plumbline.LoopbackEndpoint;

/// <summary>What the endpoint does instead of answering properly.</summary>
public enum Fault
{
    None,

    /// <summary>429 with a Retry-After header.</summary>
    TooManyRequests,

    /// <summary>500 Internal Server Error.</summary>
    ServerError,

    /// <summary>503 Service Unavailable.</summary>
    Unavailable,

    /// <summary>The connection is reset without a response.</summary>
    Reset,

    /// <summary>The answer comes after the client's timeout.</summary>
    Slow,

    /// <summary>200 with a body that is not JSON.</summary>
    MalformedJson,

    /// <summary>200 with a proper body but no log-probabilities.</summary>
    MissingLogprobs,
}
