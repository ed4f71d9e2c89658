namespace Plumbline.Reports.Model;

/// <summary>One thing that went wrong during a run without stopping it.</summary>
/// <param name="Source">Where: "input", "wcnf export", "report html" ...</param>
/// <param name="Message">What, on one line (for input: <c>file:line: field: problem</c>).</param>
public sealed record RunProblem(string Source, string Message);
