namespace Plumbline.LocalModel;

/// <summary>Where generated text ends when it reaches a stop string: before the earliest one found.</summary>
internal static class StopText
{
    /// <summary>The text before the earliest stop string it contains, or null when it contains none.</summary>
    public static string? Cut(string text, IReadOnlyList<string> stops)
    {
        var end = -1;
        foreach (var stop in stops)
        {
            if (stop.Length == 0)
            {
                continue;
            }

            var at = text.IndexOf(stop, StringComparison.Ordinal);
            if (at >= 0 && (end < 0 || at < end))
            {
                end = at;
            }
        }

        return end < 0 ? null : text[..end];
    }
}
