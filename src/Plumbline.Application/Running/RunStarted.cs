using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>The run is about to judge its first claim.</summary>
/// <param name="Header">Versions, settings and start time.</param>
/// <param name="ExpectedClaims">Usable claims in the input.</param>
public sealed record RunStarted(RunHeader Header, int ExpectedClaims);
