namespace Plumbline.Core.Runs;

/// <summary>The run figures a gate can hold a threshold against.</summary>
public enum GateFigure
{
    /// <summary>Share of labelled judged claims whose answer equals the gold label.</summary>
    CoherentAccuracy,

    /// <summary>The lower end of the coherent accuracy's Wilson 95% interval.</summary>
    CoherentLowerBound,

    /// <summary>Share of labelled judged claims whose direct answer equals the gold label.</summary>
    DirectAccuracy,

    /// <summary>Overturned claims over judged claims.</summary>
    OverturnRate,

    /// <summary>Contested claims over judged claims.</summary>
    ContestedRate,

    /// <summary>Claims that could not be judged (a count).</summary>
    FailedClaims,

    /// <summary>Mean margin of judged claims.</summary>
    MeanMargin,
}
