namespace Plumbline.Reports;

/// <summary>The one caution every report format states once, so that nobody mistakes coherence for truth.</summary>
public static class ReportNotice
{
    public const string Text =
        "A coherent answer measures the model's self-consistency, not the truth of the claim. " +
        "For medical, legal, safety or financial claims, defer to qualified review.";
}
