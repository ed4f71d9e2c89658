namespace Plumbline.Core.Runs;

/// <summary>
/// Thrown by a part of the run (a budget on model calls or tokens, for instance) to stop the whole run, not
/// only the claim at hand. The engine lets it through; the run loop stops cleanly with <see cref="Exception.Message"/>
/// as the reason, lists the claims not judged, keeps every finished verdict and reports the run as incomplete.
/// </summary>
public class RunHaltedException(string reason, Exception? inner = null) : Exception(reason, inner);
