namespace Plumbline.Core.Language.Sources;

/// <summary>A model source that cannot be used (unknown spelling, file missing, endpoint unreachable,
/// key refused, unknown model name ...), found before any claim is spent. The message is one line
/// that says what to fix; it never holds a credential.</summary>
public sealed class ModelSourceException(string message, Exception? inner = null) : Exception(message, inner);
