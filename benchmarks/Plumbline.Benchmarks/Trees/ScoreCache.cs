using System.Collections.Concurrent;
using System.Globalization;
using System.Text;
using Plumbline.Core.Entailment;

namespace Plumbline.Benchmarks.Trees;

/// <summary>
/// NLI scores of one model kept on disk: one file per model (named by the model file's SHA-256), one line
/// per (premise, hypothesis) pair, appended as pairs are scored. Scores of the shipped form of the model do
/// not depend on a pair's batch companions, so a pair scored once never needs scoring again. A grid of
/// engine settings then replays scores from memory, and a new model costs one scoring pass.
/// </summary>
internal sealed class ScoreCache
{
    private readonly ConcurrentDictionary<SentencePair, EntailmentScores> scores = new();
    private readonly string path;

    private ScoreCache(string path) => this.path = path;

    public int Count => scores.Count;

    public string Path => path;

    /// <summary>
    /// Opens (or starts) the cache file of the model with the given hash and calibration temperature in
    /// <paramref name="folder"/>: the stored probabilities depend on both.
    /// </summary>
    public static ScoreCache Open(string folder, string modelSha256, double temperature)
    {
        Directory.CreateDirectory(folder);
        var name = temperature == 1.0
            ? $"nli-{modelSha256}.tsv"
            : string.Create(CultureInfo.InvariantCulture, $"nli-{modelSha256}-t{temperature:R}.tsv");
        var cache = new ScoreCache(System.IO.Path.Combine(folder, name));
        if (File.Exists(cache.path))
        {
            foreach (var line in File.ReadLines(cache.path, Encoding.UTF8))
            {
                // A line cut short by an interrupted run is ignored: its pair is simply scored again.
                var fields = line.Split('\t');
                if (fields.Length == 5
                    && TryReal(fields[0], out var entailment) && TryReal(fields[1], out var neutral) && TryReal(fields[2], out var contradiction))
                {
                    cache.scores[new SentencePair(Unescape(fields[3]), Unescape(fields[4]))] = new EntailmentScores(entailment, neutral, contradiction);
                }
            }
        }

        return cache;
    }

    public bool TryGet(SentencePair pair, out EntailmentScores value) => scores.TryGetValue(pair, out value!);

    /// <summary>Adds scored pairs and appends them to the file at once, so an interrupted pass keeps what it scored.</summary>
    public void Add(IReadOnlyList<SentencePair> pairs, IReadOnlyList<EntailmentScores> values)
    {
        var text = new StringBuilder();
        for (var i = 0; i < pairs.Count; i++)
        {
            scores[pairs[i]] = values[i];
            text.Append(Real(values[i].Entailment)).Append('\t')
                .Append(Real(values[i].Neutral)).Append('\t')
                .Append(Real(values[i].Contradiction)).Append('\t')
                .Append(Escape(pairs[i].Premise)).Append('\t')
                .Append(Escape(pairs[i].Hypothesis)).Append('\n');
        }

        File.AppendAllText(path, text.ToString(), Encoding.UTF8);
    }

    private static string Real(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    private static bool TryReal(string text, out double value) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value);

    private static string Escape(string text) =>
        text.Replace("\\", "\\\\", StringComparison.Ordinal).Replace("\t", "\\t", StringComparison.Ordinal)
            .Replace("\n", "\\n", StringComparison.Ordinal).Replace("\r", "\\r", StringComparison.Ordinal);

    private static string Unescape(string text)
    {
        if (!text.Contains('\\', StringComparison.Ordinal))
        {
            return text;
        }

        var result = new StringBuilder(text.Length);
        for (var i = 0; i < text.Length; i++)
        {
            if (text[i] == '\\' && i + 1 < text.Length)
            {
                i++;
                result.Append(text[i] switch { 't' => '\t', 'n' => '\n', 'r' => '\r', _ => text[i] });
            }
            else
            {
                result.Append(text[i]);
            }
        }

        return result.ToString();
    }
}
