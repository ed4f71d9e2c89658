namespace Plumbline.Cli.Configuration;

/// <summary>Where a setting's value came from, for <c>plumb config</c> and for error messages.</summary>
/// <param name="Layer">Which layer gave it.</param>
/// <param name="Where">The config file's "path:line: key", the environment variable's name, or the flag.</param>
internal sealed record SettingOrigin(SettingLayer Layer, string Where)
{
    public static SettingOrigin BuiltIn { get; } = new(SettingLayer.BuiltIn, "built-in default");

    public override string ToString() => Layer switch
    {
        SettingLayer.ConfigFile => "config file " + Where,
        SettingLayer.Environment => "environment " + Where,
        SettingLayer.Flag => "flag " + Where,
        _ => Where,
    };
}
