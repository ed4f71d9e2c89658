namespace Plumbline.Reports.Json;

/// <summary>One setting two runs disagree on; a null value means that run has no such key.</summary>
public sealed record SettingDifference(string Key, string? First, string? Second);
