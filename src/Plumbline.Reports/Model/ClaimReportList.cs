using System.Runtime.CompilerServices;

namespace Plumbline.Reports.Model;

/// <summary>Claims held in memory: for small runs, tests and hand-built reports.</summary>
public sealed class ClaimReportList(IReadOnlyList<ClaimReport> claims) : IClaimReports
{
    public static ClaimReportList Empty { get; } = new([]);

    public int Count => claims.Count;

    public async IAsyncEnumerable<ClaimReport> ReadAsync([EnumeratorCancellation] CancellationToken cancellationToken)
    {
        foreach (var claim in claims)
        {
            cancellationToken.ThrowIfCancellationRequested();
            yield return claim;
        }

        await Task.CompletedTask;
    }
}
