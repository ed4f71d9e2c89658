namespace Plumbline.Cli.Tests.Doubles;

/// <summary>Claims the command tests record and judge.</summary>
internal static class TestClaims
{
    public const string Bats = "Bats are mammals.";

    public const string Sun = "The sun orbits the earth.";
}
