using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>How the run loop works.</summary>
/// <param name="ToolVersion">Plumbline's version, for the report.</param>
/// <param name="InFlight">Claims judged at once. Verdicts still come out in input order; at most this many claims
/// are held between being read and being handed to the sinks.</param>
/// <param name="Listing">Which statement pairs each claim's report lists.</param>
public sealed record RunOptions(string ToolVersion, int InFlight = RunOptions.DefaultInFlight, PairListing Listing = PairListing.Linked)
{
    /// <summary>
    /// Four claims at once: enough to keep a remote model busy while another claim is scored and solved, few enough
    /// that the NLI scoring of a recorded run does not fight over two cores.
    /// </summary>
    public const int DefaultInFlight = 4;
}
