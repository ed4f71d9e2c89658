namespace Plumbline.Application.Input;

/// <summary>Bounds on what one claim record may hold, so a stray binary file or a runaway line costs nothing.</summary>
public static class InputLimits
{
    /// <summary>Characters in one line (one record for CSV). A claim is one sentence; 64 Ki characters is far beyond any.</summary>
    public const int MaxLineCharacters = 65_536;
}
