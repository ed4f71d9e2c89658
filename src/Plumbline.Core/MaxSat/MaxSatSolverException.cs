namespace Plumbline.Core.MaxSat;

/// <summary>A solve ended without an assignment (time limit, no solution). The engine turns it into a failed
/// claim; anything else a solver throws is treated as a bug.</summary>
public sealed class MaxSatSolverException(string message, Exception? inner = null) : Exception(message, inner);
