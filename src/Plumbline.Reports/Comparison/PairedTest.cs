using Plumbline.Core.Runs;

namespace Plumbline.Reports.Comparison;

/// <summary>McNemar's exact test on one paired outcome of the claims both runs judged.</summary>
/// <param name="Outcome">"correct" (answer equals gold, over claims with the same gold label in both runs) or
/// "true" (the answer is true, over every claim answered in both runs).</param>
/// <param name="Pairs">Claims paired.</param>
/// <param name="Test">The test: <see cref="McNemarTest.FirstOnly"/> counts pairs with the outcome in the old run only.</param>
public sealed record PairedTest(string Outcome, int Pairs, McNemarTest Test)
{
    public const string Correct = "correct";

    public const string AnswerTrue = "true";
}
