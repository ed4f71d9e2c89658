namespace Plumbline.Models.Cache;

/// <summary>The response cache file cannot be used (it is not a cache, or it cannot be created); the
/// message names the file and says what to do.</summary>
public sealed class ResponseCacheException(string message, Exception? inner = null) : Exception(message, inner);
