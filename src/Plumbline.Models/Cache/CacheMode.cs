namespace Plumbline.Models.Cache;

/// <summary>How a run uses the response cache.</summary>
public enum CacheMode
{
    /// <summary>Serve cached responses; ask the model for the rest and keep them.</summary>
    Use,

    /// <summary>Ask the model for everything and overwrite what was cached.</summary>
    Refresh,
}
