using System.Runtime.CompilerServices;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>Keeps claim reports in a list: for a handful of claims (the check command) and tests.</summary>
public sealed class MemoryClaimStore : IClaimStore
{
    private readonly List<ClaimReport> claims = [];

    public int Count => claims.Count;

    public Task AddAsync(ClaimReport claim, CancellationToken cancellationToken)
    {
        claims.Add(claim);
        return Task.CompletedTask;
    }

    public async IAsyncEnumerable<ClaimReport> ReadAsync([EnumeratorCancellation] CancellationToken cancellationToken)
    {
        foreach (var claim in claims)
        {
            cancellationToken.ThrowIfCancellationRequested();
            yield return claim;
        }

        await Task.CompletedTask;
    }

    public ValueTask DisposeAsync() => ValueTask.CompletedTask;
}
