using Plumbline.Core.Coherence;

namespace Plumbline.Cli.Options;

/// <summary>What <c>check</c> and <c>sweep</c> were asked to do, validated.</summary>
/// <param name="Model">Where the model's answers come from.</param>
/// <param name="NliModelDirectory">The NLI model's folder.</param>
/// <param name="Engine">The engine's settings.</param>
/// <param name="ExportWcnfDirectory">Folder for one WCNF file per judged claim; null for none.</param>
/// <param name="Output">Report format and destination.</param>
internal sealed record JudgeSettings(
    ModelSource Model,
    string NliModelDirectory,
    CoherenceOptions Engine,
    string? ExportWcnfDirectory,
    OutputSettings Output);

/// <summary>The report's format and where it goes; a null <paramref name="Path"/> is standard output.</summary>
internal sealed record OutputSettings(string Format, string? Path);
