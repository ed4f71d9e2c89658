using System.Globalization;
using Plumbline.Core.Entailment;
using Plumbline.Nli;
using Plumbline.Nli.Evaluation;

namespace Plumbline.Benchmarks;

/// <summary>
/// <c>calibrate --model DIR --fit FILE --check FILE</c>: fits the calibration temperature of an NLI model folder on
/// held-out labelled pairs with the C# scorer (for models whose training checkpoint is not at hand, so the
/// recipe's calibrate.py cannot run), and prints the negative log-likelihood and expected calibration error
/// before and after on the fitting file and on a second file. The temperature goes into the folder's
/// nli-model.json by hand.
/// </summary>
internal static class NliCalibration
{
    public static async Task<int> RunAsync(string[] args, TextWriter output, TextWriter error)
    {
        string? model = null, fit = null, check = null;
        for (var i = 0; i < args.Length - 1; i += 2)
        {
            switch (args[i])
            {
                case "--model": model = args[i + 1]; break;
                case "--fit": fit = args[i + 1]; break;
                case "--check": check = args[i + 1]; break;
                default: await error.WriteLineAsync($"calibrate: unknown option {args[i]}"); return 2;
            }
        }

        if (model is null || fit is null || check is null)
        {
            await error.WriteLineAsync("usage: calibrate --model DIR --fit FILE --check FILE");
            return 2;
        }

        using var nli = NliModel.Load(model);
        using var scorer = new OnnxEntailmentScorer(nli);
        var prior = nli.Card.Temperature;
        var (fitLogits, fitGold) = await LogProbabilitiesAsync(scorer, fit);
        var (checkLogits, checkGold) = await LogProbabilitiesAsync(scorer, check);
        // The scorer's probabilities already carry the card's temperature; the fit is relative to it.
        var relative = TemperatureFit.Fit(fitLogits, fitGold);
        var temperature = prior * relative;
        var c = CultureInfo.InvariantCulture;
        output.WriteLine(string.Create(c, $"model {nli.Describe}; card temperature {prior:0.####}"));
        output.WriteLine(string.Create(c, $"fitted temperature {temperature:0.####} on {fitGold.Count} pairs of {fit}"));
        foreach (var (name, logits, gold) in new[] { (fit, fitLogits, fitGold), (check, checkLogits, checkGold) })
        {
            output.WriteLine(string.Create(c,
                $"{Path.GetFileName(name)}: {gold.Count} pairs; negative log-likelihood {TemperatureFit.NegativeLogLikelihood(logits, gold, 1):0.0000} -> {TemperatureFit.NegativeLogLikelihood(logits, gold, relative):0.0000}; expected calibration error {Ece(logits, gold, 1):0.0000} -> {Ece(logits, gold, relative):0.0000}"));
        }

        return 0;
    }

    private static async Task<(List<double[]> Logits, List<int> Gold)> LogProbabilitiesAsync(OnnxEntailmentScorer scorer, string file)
    {
        var set = LabelledPairReader.Read(file);
        var scores = await scorer.ScoreAsync(set.Pairs.Select(p => p.Pair).ToArray(), CancellationToken.None);
        var kinds = new[] { EntailmentKind.Entailment, EntailmentKind.Neutral, EntailmentKind.Contradiction };
        var logits = scores.Select(s => kinds.Select(k => Math.Log(Math.Max(s.ProbabilityOf(k), 1e-300))).ToArray()).ToList();
        return (logits, set.Pairs.Select(p => Array.IndexOf(kinds, p.Gold)).ToList());
    }

    private static double Ece(List<double[]> logits, List<int> gold, double temperature) =>
        CalibrationBins.ExpectedCalibrationError(logits.Select((row, i) =>
        {
            var probabilities = TemperatureFit.Probabilities(row, temperature);
            var best = Array.IndexOf(probabilities, probabilities.Max());
            return (probabilities[best], best == gold[i]);
        }).ToArray());
}
