namespace Plumbline.Core.Entailment;

public enum EntailmentKind
{
    Entailment,
    Neutral,
    Contradiction,
}
