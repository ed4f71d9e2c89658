namespace Plumbline.Reports;

/// <summary>What makes a claim's JUnit test case fail; any combination.</summary>
[Flags]
public enum JunitFailures
{
    None = 0,

    /// <summary>The coherent answer overturns the direct answer.</summary>
    Overturned = 1,

    /// <summary>The coherent answer disagrees with the claim's gold label.</summary>
    Gold = 2,

    /// <summary>The margin does not decide (contested).</summary>
    Contested = 4,

    /// <summary>The claim could not be judged (written as a JUnit error rather than a failure).</summary>
    Failed = 8,

    /// <summary>Overturned, disagreeing with gold, or failed.</summary>
    Default = Overturned | Gold | Failed,
}
