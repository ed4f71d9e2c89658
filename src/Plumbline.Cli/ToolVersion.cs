using System.Reflection;

namespace Plumbline.Cli;

/// <summary>The version reports carry: the product version without the build's source revision suffix.</summary>
internal static class ToolVersion
{
    public static string Current { get; } = Read();

    private static string Read()
    {
        var version = typeof(ToolVersion).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion
            ?? typeof(ToolVersion).Assembly.GetName().Version?.ToString()
            ?? "0.0.0";
        var plus = version.IndexOf('+', StringComparison.Ordinal);
        return plus < 0 ? version : version[..plus];
    }
}
