using System.Globalization;
using Plumbline.Core.Coherence;
using Plumbline.Core.Runs;
using Plumbline.Reports.Json;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Comparison;

/// <summary>Pairs the claims of two runs by id and works out what changed (see <see cref="ComparisonReport"/>).</summary>
public static class RunComparison
{
    /// <param name="old">The earlier run.</param>
    /// <param name="now">The later run.</param>
    /// <param name="oldFile">The earlier report's file, for the output.</param>
    /// <param name="newFile">The later report's file.</param>
    /// <param name="alpha">The regression gate's significance level; null for no gate.</param>
    /// <param name="cancellationToken">Stops the reading of the claims.</param>
    public static async Task<ComparisonReport> CompareAsync(
        RunReport old, RunReport now, string oldFile, string newFile, double? alpha, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(old);
        ArgumentNullException.ThrowIfNull(now);
        var before = new Dictionary<string, ClaimReport>(StringComparer.Ordinal);
        await foreach (var claim in old.Claims.ReadAsync(cancellationToken))
        {
            before[claim.Id] = claim;
        }

        var changes = new List<ClaimChange>();
        var onlyNew = new List<string>();
        var paired = 0;
        int worse = 0, better = 0, labelled = 0, toFalse = 0, toTrue = 0, answered = 0;
        await foreach (var claim in now.Claims.ReadAsync(cancellationToken))
        {
            if (!before.Remove(claim.Id, out var earlier))
            {
                onlyNew.Add(claim.Id);
                continue;
            }

            paired++;
            var change = new ClaimChange(claim.Id, claim.Text, earlier.Answer, claim.Answer, earlier.Status, claim.Status, Agrees(earlier), Agrees(claim));
            if (change.AnswerChanged || change.StatusChanged || change.AgreementChanged)
            {
                changes.Add(change);
            }

            if (earlier.Answer is { } a && claim.Answer is { } b)
            {
                answered++;
                toFalse += a && !b ? 1 : 0;
                toTrue += !a && b ? 1 : 0;
                if (earlier.Gold is { } gold && claim.Gold == gold)
                {
                    labelled++;
                    worse += a == gold && b != gold ? 1 : 0;
                    better += a != gold && b == gold ? 1 : 0;
                }
            }
        }

        var correctness = labelled == 0 ? null : new PairedTest(PairedTest.Correct, labelled, McNemarTest.Of(worse, better));
        var answers = answered == 0 ? null : new PairedTest(PairedTest.AnswerTrue, answered, McNemarTest.Of(toFalse, toTrue));
        return new ComparisonReport(
            oldFile,
            newFile,
            old.Header,
            now.Header,
            SettingsEntries.Differences(old.Header, now.Header),
            old.Header.Input?.Digest is not { } digest || digest != now.Header.Input?.Digest,
            paired,
            [.. before.Keys.Order(StringComparer.Ordinal)],
            onlyNew,
            changes,
            FiguresOf(old.Figures, now.Figures),
            correctness,
            answers,
            alpha is { } level ? GateOf(level, correctness, answers) : null);
    }

    private static bool? Agrees(ClaimReport claim) => claim.Gold is { } gold && claim.Answer is { } answer ? answer == gold : null;

    private static RegressionGate GateOf(double alpha, PairedTest? correctness, PairedTest? answers)
    {
        string Split(McNemarTest t, string first, string second) =>
            string.Create(CultureInfo.InvariantCulture, $"{t.FirstOnly} {first}, {t.SecondOnly} {second}, McNemar p = {ReportText.PValue(t.PValue)}");
        if (correctness is { Test: var test })
        {
            var fell = test.FirstOnly > test.SecondOnly;
            var significant = test.PValue < alpha;
            var reason = Split(test, "right before and wrong now", "wrong before and right now") +
                (fell ? significant ? $": accuracy fell, p below {Alpha(alpha)}" : $": accuracy fell, but p is not below {Alpha(alpha)}" : ": accuracy did not fall");
            return new RegressionGate(alpha, test.PValue, !(fell && significant), reason);
        }

        if (answers is { Test: var shift })
        {
            var significant = shift.PValue < alpha;
            var reason = "no claim carries the same gold label in both runs; answers: " + Split(shift, "true before and false now", "false before and true now") +
                (significant ? $": a shift with p below {Alpha(alpha)}" : $": no shift with p below {Alpha(alpha)}");
            return new RegressionGate(alpha, shift.PValue, !significant, reason);
        }

        return new RegressionGate(alpha, null, false, "no claim was answered in both runs, so nothing can be compared");
    }

    private static string Alpha(double alpha) => alpha.ToString("0.####", CultureInfo.InvariantCulture);

    private static List<FigureDelta> FiguresOf(RunFigures old, RunFigures now)
    {
        static double? Rate(RunFigures f, double value) => f.Judged == 0 ? null : value;
        return
        [
            new("claims", old.Claims, now.Claims),
            new("judged", old.Judged, now.Judged),
            new("failed", old.Failed, now.Failed),
            new("coherent_accuracy", old.CoherentAccuracy?.Value, now.CoherentAccuracy?.Value),
            new("direct_accuracy", old.DirectAccuracy?.Value, now.DirectAccuracy?.Value),
            new("overturn_rate", Rate(old, old.OverturnRate), Rate(now, now.OverturnRate)),
            new("contested_rate", Rate(old, old.ContestedRate), Rate(now, now.ContestedRate)),
            new("two_sided_rate", Rate(old, old.TwoSidedRate), Rate(now, now.TwoSidedRate)),
            new("mean_margin", Rate(old, old.MeanMargin), Rate(now, now.MeanMargin)),
            new("mean_normalised_margin", Rate(old, old.MeanNormalisedMargin), Rate(now, now.MeanNormalisedMargin)),
            new("links", old.EntailmentLinks + old.ContradictionLinks, now.EntailmentLinks + now.ContradictionLinks),
            new("model_calls", old.ModelCalls, now.ModelCalls),
            new("tokens", old.Tokens.Total, now.Tokens.Total),
        ];
    }
}
