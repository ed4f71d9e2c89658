namespace Plumbline.Cli.Configuration;

/// <summary>One setting the config file gives: the setting, its value (string, long, double, bool or a list) and the line it is on.</summary>
internal sealed record ConfigEntry(ConfigSetting Setting, object Value, int Line);
