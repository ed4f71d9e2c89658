namespace Plumbline.Cli.Composition;

/// <summary>One check of <c>plumb doctor</c>: what was checked, how it went, and what was found or what to fix.</summary>
internal sealed record SetUpCheck(string Name, SetUpOutcome Outcome, string Detail)
{
    public override string ToString() => $"{Outcome switch { SetUpOutcome.Ok => "ok     ", SetUpOutcome.Skipped => "skipped", _ => "FAIL   " }} {Name}: {Detail}";
}

/// <summary>How one check of the set-up went.</summary>
internal enum SetUpOutcome
{
    Ok,
    Skipped,
    Failed,
}
