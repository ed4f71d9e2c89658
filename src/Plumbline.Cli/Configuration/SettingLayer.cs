namespace Plumbline.Cli.Configuration;

/// <summary>The layers, lowest first: a later one overrides an earlier one.</summary>
internal enum SettingLayer
{
    BuiltIn,
    ConfigFile,
    Environment,
    Flag,
}
