namespace Plumbline.Reports.Model;

/// <summary>The claims of a run, in input order, to be read as often as a writer needs (a count first, for instance).</summary>
public interface IClaimReports
{
    /// <summary>How many claims the sequence holds.</summary>
    int Count { get; }

    /// <summary>Reads the claims from the first, each time it is called.</summary>
    IAsyncEnumerable<ClaimReport> ReadAsync(CancellationToken cancellationToken);
}
