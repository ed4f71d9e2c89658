namespace Plumbline.Core.Language;

/// <summary>A model backend could not serve a request (missing recording entry, HTTP failure ...).
/// The engine turns it into a failed claim; the message must say what was asked.</summary>
public sealed class ModelRequestException(string message, Exception? inner = null) : Exception(message, inner);
