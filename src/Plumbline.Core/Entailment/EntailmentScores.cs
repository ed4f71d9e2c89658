namespace Plumbline.Core.Entailment;

/// <summary>NLI probabilities for one (premise, hypothesis) pair; they sum to 1.</summary>
public readonly record struct EntailmentScores(double Entailment, double Neutral, double Contradiction)
{
    public EntailmentKind Kind =>
        Entailment >= Neutral && Entailment >= Contradiction ? EntailmentKind.Entailment
        : Contradiction >= Neutral ? EntailmentKind.Contradiction
        : EntailmentKind.Neutral;

    public double ProbabilityOf(EntailmentKind kind) => kind switch
    {
        EntailmentKind.Entailment => Entailment,
        EntailmentKind.Contradiction => Contradiction,
        _ => Neutral,
    };
}
