namespace Plumbline.Cli.Configuration;

/// <summary>
/// Hides what must not be printed: the password of a URL's user part and the values of its query (where some
/// servers take a key), and the values of the environment variables that hold the API key and header values.
/// </summary>
internal static class SecretMask
{
    public const string Hidden = "***";

    /// <summary>The model source with any credentials in it hidden; other sources as they are.</summary>
    public static string Source(string source)
    {
        if (!Uri.TryCreate(source, UriKind.Absolute, out var uri) || (uri.Scheme != Uri.UriSchemeHttp && uri.Scheme != Uri.UriSchemeHttps))
        {
            return source;
        }

        var builder = new UriBuilder(uri);
        if (builder.Password.Length > 0)
        {
            builder.Password = Hidden;
        }

        if (builder.Query.Length > 1)
        {
            builder.Query = string.Join('&', builder.Query.TrimStart('?').Split('&').Select(p => p.Contains('=', StringComparison.Ordinal) ? p[..(p.IndexOf('=', StringComparison.Ordinal) + 1)] + Hidden : p));
        }

        // UriBuilder adds the default port back; keep the source as it was written otherwise.
        return uri.IsDefaultPort ? builder.Uri.GetComponents(UriComponents.AbsoluteUri & ~UriComponents.Port, UriFormat.UriEscaped) : builder.Uri.AbsoluteUri;
    }

    /// <summary>"VAR (set, value hidden)" or "VAR (not set)": whether a secret's variable holds something, never what.</summary>
    public static string Variable(string name, Func<string, string?> environment) =>
        string.IsNullOrEmpty(environment(name)) ? $"{name} (not set)" : $"{name} (set, value hidden)";
}
