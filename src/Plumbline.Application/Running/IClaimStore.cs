using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>Where the run keeps each finished claim's report until the writers that need the whole run read them back.</summary>
public interface IClaimStore : IClaimReports, IAsyncDisposable
{
    Task AddAsync(ClaimReport claim, CancellationToken cancellationToken);
}
