namespace Plumbline.Models.Cache;

/// <summary>Where the response cache lives unless told otherwise: <c>$XDG_CACHE_HOME/plumbline</c>, else
/// <c>~/.cache/plumbline</c> (the XDG base directory convention).</summary>
public static class CacheDirectory
{
    public const string FileName = "responses.sqlite";

    public static string Default(Func<string, string?> environment)
    {
        ArgumentNullException.ThrowIfNull(environment);
        var xdg = environment("XDG_CACHE_HOME");
        // The convention says a relative XDG_CACHE_HOME is invalid and must be ignored.
        if (!string.IsNullOrEmpty(xdg) && Path.IsPathRooted(xdg))
        {
            return Path.Combine(xdg, "plumbline");
        }

        var home = environment("HOME");
        if (string.IsNullOrEmpty(home))
        {
            home = Environment.GetFolderPath(Environment.SpecialFolder.UserProfile);
        }

        return Path.Combine(home, ".cache", "plumbline");
    }
}
