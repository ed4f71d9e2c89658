namespace Plumbline.Cli.Configuration;

/// <summary>The TOML type a setting takes in the config file.</summary>
internal enum ConfigValueKind
{
    /// <summary>A string.</summary>
    Text,

    /// <summary>An integer.</summary>
    WholeNumber,

    /// <summary>An integer or a float.</summary>
    Number,

    /// <summary>true or false.</summary>
    Switch,

    /// <summary>An array of strings; the option is repeated once per item.</summary>
    TextList,

    /// <summary>An array of integers; the option gets them comma-separated.</summary>
    WholeNumberList,
}
