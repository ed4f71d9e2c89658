using System.Runtime.CompilerServices;
using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>
/// Writes each claim report as one JSON line to a temporary file and reads them back on demand, so a run's
/// memory does not grow with its claims however many the writers need at the end. The file is deleted on dispose.
/// </summary>
public sealed class SpillClaimStore : IClaimStore
{
    private readonly string path;
    private readonly FileStream file;
    private int count;

    private SpillClaimStore(string path)
    {
        this.path = path;
        file = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.Read, 1 << 16);
    }

    public int Count => count;

    /// <summary>A new spill file in <paramref name="folder"/> (the system's temporary folder by default).</summary>
    public static SpillClaimStore Create(string? folder = null) =>
        new(Path.Combine(folder ?? Path.GetTempPath(), $"plumb-claims-{Guid.NewGuid():N}.jsonl"));

    public async Task AddAsync(ClaimReport claim, CancellationToken cancellationToken)
    {
        await JsonSerializer.SerializeAsync(file, claim, SpillJson.Default.ClaimReport, cancellationToken);
        file.WriteByte((byte)'\n');
        count++;
    }

    public async IAsyncEnumerable<ClaimReport> ReadAsync([EnumeratorCancellation] CancellationToken cancellationToken)
    {
        await file.FlushAsync(cancellationToken);
        await using var read = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite, 1 << 16);
        using var reader = new StreamReader(read, Encoding.UTF8);
        for (var i = 0; i < count && await reader.ReadLineAsync(cancellationToken) is { } line; i++)
        {
            yield return JsonSerializer.Deserialize(line, SpillJson.Default.ClaimReport)
                ?? throw new InvalidDataException($"spill file {path}: line {i + 1} is empty");
        }
    }

    public async ValueTask DisposeAsync()
    {
        await file.DisposeAsync();
        File.Delete(path);
    }
}

/// <summary>Source-generated serialisation of the claim report, for the spill file only (its shape is internal).</summary>
[JsonSerializable(typeof(ClaimReport))]
internal sealed partial class SpillJson : JsonSerializerContext;
