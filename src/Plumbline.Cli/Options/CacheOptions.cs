using System.CommandLine;
using Plumbline.Application;
using Plumbline.Models.Cache;

namespace Plumbline.Cli.Options;

/// <summary><c>--cache-dir</c>, <c>--no-cache</c> and <c>--refresh-cache</c>.</summary>
internal sealed class CacheOptions
{
    private readonly Option<string?> directory = new("--cache-dir")
    {
        Description = "Folder of the response cache (default $XDG_CACHE_HOME/plumbline, else ~/.cache/plumbline).",
        HelpName = "DIR",
    };

    private readonly Option<bool> bypass = new("--no-cache")
    {
        Description = "Neither read nor write the response cache.",
    };

    private readonly Option<bool> refresh = new("--refresh-cache")
    {
        Description = "Ask the model again for everything and overwrite the cached answers.",
    };

    public void AddTo(Command command, bool judging = true)
    {
        command.Options.Add(directory);
        if (judging)
        {
            command.Options.Add(bypass);
            command.Options.Add(refresh);
        }
    }

    /// <exception cref="UsageException">Both --no-cache and --refresh-cache.</exception>
    public CacheSettings Read(ParseResult parse)
    {
        var runModes = parse.CommandResult.Command.Options.Contains(bypass);
        var off = runModes && parse.GetValue(bypass);
        var again = runModes && parse.GetValue(refresh);
        if (off && again)
        {
            throw new UsageException("--no-cache and --refresh-cache: choose one");
        }

        var folder = parse.GetValue(directory);
        if (folder is { Length: 0 })
        {
            throw new UsageException("--cache-dir: the folder name is empty");
        }

        return new CacheSettings(!off, again ? CacheMode.Refresh : CacheMode.Use, folder);
    }
}

/// <summary>Whether and how a run uses the response cache, and where it is (null: the default folder).</summary>
internal sealed record CacheSettings(bool Enabled, CacheMode Mode, string? Directory)
{
    /// <summary>The cache file: <c>responses.sqlite</c> in the named or default folder.</summary>
    public string FilePath(Func<string, string?> environment) =>
        Path.Combine(Directory ?? CacheDirectory.Default(environment), CacheDirectory.FileName);
}
