using Plumbline.Core.Coherence;

namespace Plumbline.Reports.Comparison;

/// <summary>A claim judged in both runs whose answer, status or agreement with its gold label changed.</summary>
/// <param name="Id">The claim's id.</param>
/// <param name="Text">The claim as the new run read it.</param>
/// <param name="OldAnswer">The answer in the old run (null when it failed).</param>
/// <param name="NewAnswer">The answer in the new run.</param>
/// <param name="OldStatus">The status in the old run.</param>
/// <param name="NewStatus">The status in the new run.</param>
/// <param name="OldAgrees">The old answer equals the old run's gold label; null without a label or an answer.</param>
/// <param name="NewAgrees">The new answer equals the new run's gold label; null without a label or an answer.</param>
public sealed record ClaimChange(
    string Id,
    string Text,
    bool? OldAnswer,
    bool? NewAnswer,
    ClaimStatus OldStatus,
    ClaimStatus NewStatus,
    bool? OldAgrees,
    bool? NewAgrees)
{
    public bool AnswerChanged => OldAnswer != NewAnswer;

    public bool StatusChanged => OldStatus != NewStatus;

    public bool AgreementChanged => OldAgrees != NewAgrees;
}
