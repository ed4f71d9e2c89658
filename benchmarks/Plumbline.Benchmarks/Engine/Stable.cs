namespace Plumbline.Benchmarks.Engine;

/// <summary>A hash that is the same in every process (string.GetHashCode is not), mapped to [0, 1).</summary>
internal static class Stable
{
    public static double Fraction(string text)
    {
        // 64-bit FNV-1a (common practice).
        var hash = 14695981039346656037UL;
        foreach (var c in text)
        {
            hash = (hash ^ c) * 1099511628211UL;
        }

        return (hash >> 11) / (double)(1UL << 53);
    }
}
