namespace Plumbline.Reports.Model;

/// <summary>Which statement pairs a claim's report lists.</summary>
public enum PairListing
{
    /// <summary>Pairs joined by at least one link (the default).</summary>
    Linked,

    /// <summary>Every pair of kept statements, neutral ones included (the verbose option).</summary>
    All,
}
