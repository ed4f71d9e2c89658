using System.Text.Json;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Core.Runs;
using Plumbline.Core.Trees;

namespace Plumbline.Reports.Json;

/// <summary>
/// The report's JSON shape, piece by piece, so that a streaming format can write the same claim
/// objects one per line. Properties are written in a fixed order and numbers through
/// <see cref="ReportNumbers"/>, which keeps two writes of one report identical.
/// The shape is pinned by schemas/plumbline-report-1.schema.json; change both together.
/// </summary>
internal static class ReportJson
{
    public const string WeightScaleMeaning =
        "Margins, thresholds and clause weights are in clause-weight units; the solver receives each weight " +
        "multiplied by this factor and rounded to an integer, and objective_cost is in those integer units.";

    /// <summary>Everything before the claims: version, notice, settings, times and figures.</summary>
    public static void WriteHead(Utf8JsonWriter json, RunReport report)
    {
        json.WriteNumber("schema_version", report.SchemaVersion);
        json.WriteString("plumbline_version", report.ToolVersion);
        json.WriteString("notice", ReportNotice.Text);
        json.WritePropertyName("settings");
        WriteSettings(json, report.Settings);
        json.WriteString("started", ReportNumbers.Instant(report.Started));
        json.WriteString("finished", ReportNumbers.Instant(report.Finished));
        json.WritePropertyName("figures");
        WriteFigures(json, report.Figures);
    }

    public static void WriteSettings(Utf8JsonWriter json, RunSettings settings)
    {
        json.WriteStartObject();
        json.WriteString("model_source", settings.ModelSource);
        json.WriteString("nli_model", settings.NliModel);
        json.WritePropertyName("tree_shape");
        WriteShape(json, settings.Shape);
        json.WriteString("negation_mode", ReportWords.Of(settings.Negation));
        json.WriteStartObject("thresholds");
        json.WriteNumber("contested_margin", ReportNumbers.Round(settings.ContestedThreshold, "settings.contested_threshold"));
        json.WriteEndObject();
        json.WriteString("weighting", ReportWords.Of(settings.Weighting));
        json.WriteStartObject("weight_scale");
        json.WriteNumber("factor", settings.WeightScale);
        json.WriteString("meaning", WeightScaleMeaning);
        json.WriteEndObject();
        WriteNullable(json, "seed", settings.Seed);
        json.WriteString("prompt_version", settings.PromptVersion);
        json.WriteString("solver", settings.Solver);
        json.WriteEndObject();
    }

    public static void WriteFigures(Utf8JsonWriter json, RunFigures figures)
    {
        json.WriteStartObject();
        json.WriteNumber("claims", figures.Claims);
        json.WriteNumber("judged", figures.Judged);
        json.WriteNumber("settled", figures.Settled);
        json.WriteNumber("overturned", figures.Overturned);
        json.WriteNumber("contested", figures.Contested);
        json.WriteNumber("failed", figures.Failed);
        json.WriteNumber("labelled", figures.Labelled);
        WriteAccuracy(json, "direct_accuracy", figures.DirectAccuracy);
        WriteAccuracy(json, "coherent_accuracy", figures.CoherentAccuracy);
        json.WriteNumber("overturn_rate", ReportNumbers.Round(figures.OverturnRate, "figures.overturn_rate"));
        json.WriteNumber("contested_rate", ReportNumbers.Round(figures.ContestedRate, "figures.contested_rate"));
        json.WriteNumber("two_sided_rate", ReportNumbers.Round(figures.TwoSidedRate, "figures.two_sided_rate"));
        json.WriteNumber("mean_margin", ReportNumbers.Round(figures.MeanMargin, "figures.mean_margin"));
        json.WriteStartObject("links");
        json.WriteNumber("entailment", figures.EntailmentLinks);
        json.WriteNumber("contradiction", figures.ContradictionLinks);
        json.WriteEndObject();
        json.WriteNumber("model_calls", figures.ModelCalls);
        WriteTokens(json, figures.Tokens);
        json.WriteNumber("wall_time_ms", ReportNumbers.Milliseconds(figures.WallTime));
        json.WriteEndObject();
    }

    /// <summary>One claim's entry, the same object in the report's "claims" array and in a streamed line.</summary>
    public static void WriteClaim(Utf8JsonWriter json, Verdict verdict)
    {
        var claim = verdict.Claim;
        var where = $"claims[{claim.Id}]";
        var statements = verdict.Tree?.Statements ?? [];

        json.WriteStartObject();
        json.WriteString("id", claim.Id);
        json.WriteString("claim", claim.Text);
        WriteNullable(json, "gold", claim.Gold);
        json.WriteStartArray("tags");
        foreach (var tag in claim.Tags)
        {
            json.WriteStringValue(tag);
        }

        json.WriteEndArray();
        WriteNullable(json, "answer", verdict.Answer);
        WriteNullable(json, "direct_answer", verdict.DirectAnswer);
        json.WriteString("status", ReportWords.Of(verdict.Status));
        json.WriteNumber("margin", ReportNumbers.Round(verdict.Margin, $"{where}.margin"));
        json.WriteBoolean("two_sided", verdict.TwoSided);
        json.WriteBoolean("probabilities_estimated", verdict.ProbabilitiesEstimated);

        json.WriteStartObject("counts");
        json.WriteNumber("statements", statements.Count);
        json.WriteNumber("kept", statements.Count(s => s.Kept));
        json.WriteNumber("pruned", verdict.PrunedCount);
        json.WriteNumber("integral", verdict.IntegralCount);
        json.WriteEndObject();

        json.WriteStartArray("statements");
        foreach (var statement in statements)
        {
            WriteStatement(json, statement, $"{where}.statements[{statement.Id}]");
        }

        json.WriteEndArray();

        json.WriteStartArray("links");
        foreach (var link in verdict.Links)
        {
            json.WriteStartObject();
            json.WriteNumber("from", link.From);
            json.WriteNumber("to", link.To);
            json.WriteString("kind", ReportWords.Of(link.Kind));
            json.WriteNumber("probability", ReportNumbers.Round(link.Probability, $"{where}.links.probability"));
            json.WriteEndObject();
        }

        json.WriteEndArray();

        json.WriteStartArray("falsified_clauses");
        foreach (var clause in verdict.Falsified)
        {
            json.WriteStartObject();
            json.WriteNumber("index", clause.Index);
            json.WriteString("origin", clause.Origin.ToString());
            json.WriteStartArray("literals");
            foreach (var literal in clause.Literals)
            {
                json.WriteNumberValue(literal);
            }

            json.WriteEndArray();
            json.WriteNumber("weight", ReportNumbers.Round(clause.Weight, $"{where}.falsified_clauses.weight"));
            json.WriteEndObject();
        }

        json.WriteEndArray();

        WriteNullable(json, "solve_status", verdict.SolveStatus is { } status ? ReportWords.Of(status) : null);
        WriteNullable(json, "objective_cost", verdict.ObjectiveCost);
        json.WriteNumber("model_calls", verdict.ModelCalls);
        WriteTokens(json, verdict.Tokens);
        json.WriteStartObject("timings_ms");
        json.WriteNumber("tree", ReportNumbers.Milliseconds(verdict.Timings.Tree));
        json.WriteNumber("nli", ReportNumbers.Milliseconds(verdict.Timings.Nli));
        json.WriteNumber("solve", ReportNumbers.Milliseconds(verdict.Timings.Solve));
        json.WriteNumber("total", ReportNumbers.Milliseconds(verdict.Timings.Total));
        json.WriteEndObject();
        WriteNullable(json, "error", verdict.Error);
        json.WriteEndObject();
    }

    private static void WriteStatement(Utf8JsonWriter json, Statement statement, string where)
    {
        json.WriteStartObject();
        json.WriteNumber("id", statement.Id);
        json.WriteString("text", statement.Text);
        json.WriteString("negation", statement.Negation);
        json.WriteBoolean("negation_from_model", statement.NegationFromModel);
        json.WriteNumber("depth", statement.Depth);
        WriteNullable(json, "parent", statement.ParentId);
        WriteNullable(json, "generated_for", statement.GeneratedFor);
        json.WriteString("integrity", ReportWords.Of(statement.Integrity));
        json.WriteNumber("belief", ReportNumbers.Round(statement.Belief, $"{where}.belief"));
        json.WriteNumber("p_true", ReportNumbers.Round(statement.PTrue, $"{where}.p_true"));
        json.WriteNumber("p_true_of_negation", ReportNumbers.Round(statement.PTrueOfNegation, $"{where}.p_true_of_negation"));
        json.WriteBoolean("kept", statement.Kept);
        json.WriteEndObject();
    }

    private static void WriteShape(Utf8JsonWriter json, TreeShape shape)
    {
        json.WriteStartObject();
        json.WriteNumber("max_depth", shape.MaxDepth);
        json.WriteStartArray("levels");
        for (var depth = 1; depth <= shape.MaxDepth; depth++)
        {
            var level = shape.AtDepth(depth);
            json.WriteStartObject();
            json.WriteNumber("depth", depth);
            json.WriteNumber("width", level.Width);
            json.WritePropertyName("decoding");
            WriteDecoding(json, level.Decoding, $"settings.tree_shape.levels[{depth}]");
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void WriteDecoding(Utf8JsonWriter json, Decoding decoding, string where)
    {
        json.WriteStartObject();
        json.WriteBoolean("greedy", decoding.IsGreedy);
        json.WriteNumber("temperature", ReportNumbers.Round(decoding.Temperature, $"{where}.temperature"));
        json.WriteNumber("top_p", ReportNumbers.Round(decoding.TopP, $"{where}.top_p"));
        json.WriteNumber("max_tokens", decoding.MaxTokens);
        json.WriteStartArray("stop");
        foreach (var stop in decoding.Stop)
        {
            json.WriteStringValue(stop);
        }

        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void WriteAccuracy(Utf8JsonWriter json, string name, Proportion? accuracy)
    {
        if (accuracy is null)
        {
            json.WriteNull(name);
            return;
        }

        json.WriteStartObject(name);
        json.WriteNumber("correct", accuracy.Successes);
        json.WriteNumber("labelled", accuracy.Total);
        json.WriteNumber("value", ReportNumbers.Round(accuracy.Value, $"figures.{name}.value"));
        json.WriteStartObject("wilson_95");
        json.WriteNumber("low", ReportNumbers.Round(accuracy.Low, $"figures.{name}.low"));
        json.WriteNumber("high", ReportNumbers.Round(accuracy.High, $"figures.{name}.high"));
        json.WriteEndObject();
        json.WriteEndObject();
    }

    private static void WriteTokens(Utf8JsonWriter json, TokenUsage tokens)
    {
        json.WriteStartObject("tokens");
        json.WriteNumber("prompt", tokens.PromptTokens);
        json.WriteNumber("completion", tokens.CompletionTokens);
        json.WriteNumber("total", tokens.Total);
        json.WriteEndObject();
    }

    private static void WriteNullable(Utf8JsonWriter json, string name, bool? value)
    {
        if (value is { } v)
        {
            json.WriteBoolean(name, v);
        }
        else
        {
            json.WriteNull(name);
        }
    }

    private static void WriteNullable(Utf8JsonWriter json, string name, long? value)
    {
        if (value is { } v)
        {
            json.WriteNumber(name, v);
        }
        else
        {
            json.WriteNull(name);
        }
    }

    private static void WriteNullable(Utf8JsonWriter json, string name, string? value)
    {
        if (value is null)
        {
            json.WriteNull(name);
        }
        else
        {
            json.WriteString(name, value);
        }
    }
}
