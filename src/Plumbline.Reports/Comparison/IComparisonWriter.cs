namespace Plumbline.Reports.Comparison;

/// <summary>Renders a comparison of two runs in one format.</summary>
public interface IComparisonWriter
{
    string Format { get; }

    Task WriteAsync(ComparisonReport comparison, Stream output, CancellationToken cancellationToken);
}
