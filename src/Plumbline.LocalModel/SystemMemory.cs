using System.Globalization;

namespace Plumbline.LocalModel;

/// <summary>Memory figures of this machine and process, for the size check and for reports.</summary>
public static class SystemMemory
{
    /// <summary>
    /// Bytes a new model could take now: the kernel's MemAvailable estimate where /proc/meminfo exists, capped
    /// by the runtime's view of the memory it may use (which honours a container's limit).
    /// </summary>
    public static long Available()
    {
        var limit = GC.GetGCMemoryInfo().TotalAvailableMemoryBytes;
        return MemAvailable() is { } available ? Math.Min(available, limit) : limit;
    }

    /// <summary>This process's resident memory now, in bytes.</summary>
    public static long Resident()
    {
        using var process = System.Diagnostics.Process.GetCurrentProcess();
        return process.WorkingSet64;
    }

    /// <summary>The most resident memory this process has had (VmHWM), where the system reports it.</summary>
    public static long? PeakResident() => ProcStatusKilobytes("/proc/self/status", "VmHWM:");

    private static long? MemAvailable() => ProcStatusKilobytes("/proc/meminfo", "MemAvailable:");

    private static long? ProcStatusKilobytes(string file, string key)
    {
        try
        {
            var line = File.ReadLines(file).FirstOrDefault(l => l.StartsWith(key, StringComparison.Ordinal));
            var number = line?[key.Length..].Trim().Split(' ')[0];
            return long.TryParse(number, NumberStyles.None, CultureInfo.InvariantCulture, out var kilobytes) ? kilobytes * 1024 : null;
        }
        catch (IOException)
        {
            return null;
        }
        catch (UnauthorizedAccessException)
        {
            return null;
        }
    }

    /// <summary>"1.2 GiB", "340.5 MiB": sizes as people read them.</summary>
    public static string Format(long bytes) => bytes >= 1L << 30
        ? (bytes / (double)(1L << 30)).ToString("0.0", CultureInfo.InvariantCulture) + " GiB"
        : (bytes / (double)(1L << 20)).ToString("0.0", CultureInfo.InvariantCulture) + " MiB";
}
