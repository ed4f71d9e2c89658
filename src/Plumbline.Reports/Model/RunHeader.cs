using Plumbline.Core.Runs;

namespace Plumbline.Reports.Model;

/// <summary>What is known when a run starts: versions, the settings in use, the start time and how much each claim lists.</summary>
/// <param name="SchemaVersion">The JSON report's schema version.</param>
/// <param name="ToolVersion">Plumbline's version.</param>
/// <param name="Settings">The settings the run actually uses.</param>
/// <param name="Started">When the run started.</param>
/// <param name="Listing">Which statement pairs each claim lists.</param>
public sealed record RunHeader(int SchemaVersion, string ToolVersion, RunSettings Settings, DateTimeOffset Started, PairListing Listing)
{
    /// <summary>Bump when the report's shape changes incompatibly (and add schemas/plumbline-report-N.schema.json).</summary>
    public const int CurrentSchemaVersion = 2;

    public static RunHeader Create(string toolVersion, RunSettings settings, DateTimeOffset started, PairListing listing = PairListing.Linked) =>
        new(CurrentSchemaVersion, toolVersion, settings, started, listing);
}
