using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>The run is over, complete or not; the report holds the figures and reads its claims back from the store.</summary>
public sealed record RunFinished(RunReport Report);
