namespace Plumbline.Reports;

/// <summary>Choices the command line makes for the writers; a format ignores what does not concern it.</summary>
/// <param name="Colour">Mark up terminal text with ANSI colours (the caller decides whether its terminal wants them).</param>
/// <param name="JunitFailures">What makes a JUnit test case fail.</param>
public sealed record ReportOptions(bool Colour = false, JunitFailures JunitFailures = JunitFailures.Default)
{
    public static ReportOptions Default { get; } = new();
}
