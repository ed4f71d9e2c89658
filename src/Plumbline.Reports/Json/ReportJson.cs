using System.Text.Json;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.Runs;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Json;

/// <summary>
/// The report's JSON shape, piece by piece, so that the JSON Lines format writes the same objects one per line.
/// Properties are written in a fixed order and numbers through <see cref="ReportNumbers"/>, which keeps two writes
/// of one report identical. The shape is pinned by schemas/plumbline-report-2.schema.json (and the lines by
/// schemas/plumbline-lines-2.schema.json); change them together.
/// </summary>
internal static class ReportJson
{
    public const string WeightScaleMeaning =
        "Margins, thresholds and clause weights are in clause-weight units; the solver receives each weight " +
        "multiplied by this factor and rounded to an integer, and objective_cost is in those integer units.";

    /// <summary>Version, notice, settings and start: what is known when the run begins.</summary>
    public static void WriteHead(Utf8JsonWriter json, RunHeader header)
    {
        json.WriteNumber("schema_version", header.SchemaVersion);
        json.WriteString("plumbline_version", header.ToolVersion);
        json.WriteString("notice", ReportNotice.Text);
        json.WritePropertyName("settings");
        WriteSettings(json, header);
        json.WriteString("started", ReportNumbers.Instant(header.Started));
    }

    /// <summary>End, figures, gates and completion: what is known when the run is over.</summary>
    public static void WriteSummary(Utf8JsonWriter json, RunReport report)
    {
        json.WriteString("finished", ReportNumbers.Instant(report.Finished));
        json.WritePropertyName("figures");
        WriteFigures(json, report.Figures);
        json.WriteStartArray("gates");
        foreach (var gate in report.Gates)
        {
            json.WriteStartObject();
            json.WriteString("name", gate.Name);
            WriteNullable(json, "value", gate.Value, $"gates.{gate.Name}.value");
            json.WriteString("comparison", gate.Comparison);
            json.WriteNumber("threshold", ReportNumbers.Round(gate.Threshold, $"gates.{gate.Name}.threshold"));
            json.WriteBoolean("passed", gate.Passed);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        var completion = report.Completion;
        json.WriteStartObject("completion");
        json.WriteBoolean("complete", completion.IsComplete);
        WriteNullable(json, "stopped_because", completion.StoppedBecause);
        json.WriteStartArray("not_judged");
        foreach (var id in completion.NotJudged)
        {
            json.WriteStringValue(id);
        }

        json.WriteEndArray();
        json.WriteStartArray("problems");
        foreach (var problem in completion.Problems)
        {
            json.WriteStartObject();
            json.WriteString("source", problem.Source);
            json.WriteString("message", problem.Message);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void WriteSettings(Utf8JsonWriter json, RunHeader header)
    {
        var settings = header.Settings;
        json.WriteStartObject();
        json.WriteString("model_source", settings.ModelSource);
        json.WriteString("nli_model", settings.NliModel);
        json.WritePropertyName("tree_shape");
        WriteShape(json, settings);
        json.WriteString("negation_mode", ReportWords.Of(settings.Negation));
        json.WriteStartObject("thresholds");
        json.WriteNumber("contested_margin", ReportNumbers.Round(settings.ContestedThreshold, "settings.contested_threshold"));
        json.WriteEndObject();
        json.WriteString("weighting", ReportWords.Of(settings.Weighting));
        json.WriteStartObject("weight_scale");
        json.WriteNumber("factor", settings.WeightScale);
        json.WriteString("meaning", WeightScaleMeaning);
        json.WriteEndObject();
        if (settings.Seed is { } seed)
        {
            json.WriteNumber("seed", seed);
        }
        else
        {
            json.WriteNull("seed");
        }

        json.WriteString("prompt_version", settings.PromptVersion);
        json.WriteString("solver", settings.Solver);
        json.WriteString("pairs_listed", ReportWords.Of(header.Listing));
        json.WriteStartObject("rules");
        json.WriteNumber("integrity_gap", ReportNumbers.Round(settings.IntegrityGap, "settings.rules.integrity_gap"));
        json.WriteString("belief_form", ReportWords.Of(settings.BeliefForm));
        json.WriteNumber("link_floor", ReportNumbers.Round(settings.LinkFloor, "settings.rules.link_floor"));
        json.WriteString("conflicts", ReportWords.Of(settings.Conflicts));
        json.WriteString("contradictions", ReportWords.Of(settings.Contradictions));
        json.WriteString("nli_text", ReportWords.Of(settings.NliText));
        json.WriteBoolean("discard_cut_off", settings.DiscardCutOff);
        json.WriteBoolean("expand_integral_claim", settings.ExpandIntegralClaim);
        json.WriteBoolean("claim_belief", settings.ClaimBelief);
        json.WriteString("direct_answer", ReportWords.Of(settings.DirectAnswer));
        json.WriteNumber("samples", settings.Samples);
        json.WriteEndObject();
        json.WriteEndObject();
    }

    private static void WriteFigures(Utf8JsonWriter json, RunFigures figures)
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
        WriteAccuracy(json, "paired_direct_accuracy", figures.PairedDirectAccuracy);
        json.WriteNumber("overturn_rate", ReportNumbers.Round(figures.OverturnRate, "figures.overturn_rate"));
        json.WriteNumber("contested_rate", ReportNumbers.Round(figures.ContestedRate, "figures.contested_rate"));
        json.WriteNumber("two_sided_rate", ReportNumbers.Round(figures.TwoSidedRate, "figures.two_sided_rate"));
        json.WriteNumber("mean_margin", ReportNumbers.Round(figures.MeanMargin, "figures.mean_margin"));
        json.WriteNumber("mean_normalised_margin", ReportNumbers.Round(figures.MeanNormalisedMargin, "figures.mean_normalised_margin"));
        WriteNullable(json, "mean_stability", figures.MeanStability, "figures.mean_stability");
        json.WriteNumber("stability_ties", figures.StabilityTies);
        json.WriteNumber("conflicting_pairs", figures.ConflictingPairs);
        json.WriteNumber("cut_off_discarded", figures.CutOffDiscarded);
        json.WriteNumber("estimated_claims", figures.EstimatedClaims);
        json.WriteStartObject("links");
        json.WriteNumber("entailment", figures.EntailmentLinks);
        json.WriteNumber("contradiction", figures.ContradictionLinks);
        json.WriteEndObject();
        json.WriteNumber("model_calls", figures.ModelCalls);
        WriteTokens(json, figures.Tokens);
        json.WriteNumber("wall_time_ms", ReportNumbers.Milliseconds(figures.WallTime));
        json.WriteEndObject();
    }

    /// <summary>One claim's entry, the same object in the report's "claims" array and in a JSON Lines record.</summary>
    public static void WriteClaimBody(Utf8JsonWriter json, ClaimReport claim)
    {
        var where = $"claims[{claim.Id}]";
        json.WriteString("id", claim.Id);
        json.WriteString("claim", claim.Text);
        WriteNullable(json, "gold", claim.Gold);
        json.WriteStartArray("tags");
        foreach (var tag in claim.Tags)
        {
            json.WriteStringValue(tag);
        }

        json.WriteEndArray();
        WriteNullable(json, "answer", claim.Answer);
        WriteNullable(json, "direct_answer", claim.DirectAnswer);
        WriteNullable(json, "paired_direct_answer", claim.PairedDirectAnswer);
        json.WriteString("status", ReportWords.Of(claim.Status));
        json.WriteNumber("margin", ReportNumbers.Round(claim.Margin, $"{where}.margin"));
        json.WriteNumber("normalised_margin", ReportNumbers.Round(claim.NormalisedMargin, $"{where}.normalised_margin"));
        if (claim.Stability is { } stability)
        {
            json.WriteStartObject("stability");
            json.WriteNumber("trees", stability.Trees);
            json.WriteNumber("agreeing", stability.Agreeing);
            json.WriteBoolean("tied", stability.Tied);
            json.WriteNumber("share", ReportNumbers.Round(stability.Share, $"{where}.stability.share"));
            json.WriteEndObject();
        }
        else
        {
            json.WriteNull("stability");
        }

        json.WriteBoolean("two_sided", claim.TwoSided);
        json.WriteBoolean("probabilities_estimated", claim.ProbabilitiesEstimated);

        json.WriteStartObject("counts");
        json.WriteNumber("statements", claim.Statements.Count);
        json.WriteNumber("kept", claim.Statements.Count(s => s.Kept));
        json.WriteNumber("pruned", claim.PrunedCount);
        json.WriteNumber("integral", claim.IntegralCount);
        json.WriteNumber("cut_off_discarded", claim.CutOffDiscarded);
        json.WriteEndObject();

        json.WriteStartArray("statements");
        foreach (var statement in claim.Statements)
        {
            WriteStatement(json, statement, $"{where}.statements[{statement.Id}]");
        }

        json.WriteEndArray();

        json.WriteStartArray("links");
        foreach (var link in claim.Links)
        {
            WriteLink(json, link, where);
        }

        json.WriteEndArray();

        json.WriteStartArray("pairs");
        foreach (var pair in claim.Pairs)
        {
            json.WriteStartObject();
            json.WriteNumber("first", pair.First);
            json.WriteNumber("second", pair.Second);
            json.WriteBoolean("linked", pair.Linked);
            json.WritePropertyName("forward");
            WriteScores(json, pair.Forward, $"{where}.pairs.forward");
            json.WritePropertyName("backward");
            WriteScores(json, pair.Backward, $"{where}.pairs.backward");
            json.WriteEndObject();
        }

        json.WriteEndArray();
        json.WriteStartArray("conflicts");
        foreach (var conflict in claim.Conflicts)
        {
            json.WriteStartObject();
            json.WritePropertyName("entailment");
            json.WriteStartObject();
            WriteLinkBody(json, conflict.Entailment, where);
            json.WriteEndObject();
            json.WritePropertyName("contradiction");
            json.WriteStartObject();
            WriteLinkBody(json, conflict.Contradiction, where);
            json.WriteEndObject();
            json.WriteBoolean("dropped", conflict.Dropped);
            json.WriteEndObject();
        }

        json.WriteEndArray();
        WriteClauses(json, "falsified_clauses", claim.Falsified, where);
        WriteClauses(json, "deciding_clauses", claim.Deciding, where);

        WriteNullable(json, "solve_status", claim.SolveStatus is { } status ? ReportWords.Of(status) : null);
        if (claim.ObjectiveCost is { } cost)
        {
            json.WriteNumber("objective_cost", cost);
        }
        else
        {
            json.WriteNull("objective_cost");
        }

        json.WriteNumber("model_calls", claim.ModelCalls);
        WriteTokens(json, claim.Tokens);
        json.WriteStartObject("timings_ms");
        json.WriteNumber("tree", ReportNumbers.Milliseconds(claim.Timings.Tree));
        json.WriteNumber("nli", ReportNumbers.Milliseconds(claim.Timings.Nli));
        json.WriteNumber("solve", ReportNumbers.Milliseconds(claim.Timings.Solve));
        json.WriteNumber("total", ReportNumbers.Milliseconds(claim.Timings.Total));
        json.WriteEndObject();
        WriteNullable(json, "error", claim.Error);
    }

    private static void WriteStatement(Utf8JsonWriter json, StatementReport statement, string where)
    {
        json.WriteStartObject();
        json.WriteNumber("id", statement.Id);
        json.WriteString("text", statement.Text);
        json.WriteString("negation", statement.Negation);
        json.WriteBoolean("negation_from_model", statement.NegationFromModel);
        json.WriteNumber("depth", statement.Depth);
        if (statement.Parent is { } parent)
        {
            json.WriteNumber("parent", parent);
        }
        else
        {
            json.WriteNull("parent");
        }

        WriteNullable(json, "generated_for", statement.GeneratedFor);
        json.WriteString("integrity", ReportWords.Of(statement.Integrity));
        json.WriteNumber("belief", ReportNumbers.Round(statement.Belief, $"{where}.belief"));
        json.WriteNumber("p_true", ReportNumbers.Round(statement.PTrue, $"{where}.p_true"));
        json.WriteNumber("p_true_of_negation", ReportNumbers.Round(statement.PTrueOfNegation, $"{where}.p_true_of_negation"));
        json.WriteBoolean("kept", statement.Kept);
        WriteNullable(json, "value", statement.Value);
        json.WriteStartArray("links");
        foreach (var link in statement.Links)
        {
            WriteLink(json, link, where);
        }

        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void WriteLink(Utf8JsonWriter json, Link link, string where)
    {
        json.WriteStartObject();
        WriteLinkBody(json, link, where);
        json.WriteEndObject();
    }

    private static void WriteLinkBody(Utf8JsonWriter json, Link link, string where)
    {
        json.WriteNumber("from", link.From);
        json.WriteNumber("to", link.To);
        json.WriteString("kind", ReportWords.Of(link.Kind));
        json.WriteNumber("probability", ReportNumbers.Round(link.Probability, $"{where}.links.probability"));
        json.WriteBoolean("from_negation", link.FromNegation);
        json.WriteBoolean("to_negation", link.ToNegation);
    }

    private static void WriteScores(Utf8JsonWriter json, EntailmentScores scores, string where)
    {
        json.WriteStartObject();
        json.WriteString("label", ReportWords.Label(scores.Kind));
        json.WriteNumber("entailment", ReportNumbers.Round(scores.Entailment, $"{where}.entailment"));
        json.WriteNumber("neutral", ReportNumbers.Round(scores.Neutral, $"{where}.neutral"));
        json.WriteNumber("contradiction", ReportNumbers.Round(scores.Contradiction, $"{where}.contradiction"));
        json.WriteEndObject();
    }

    private static void WriteClauses(Utf8JsonWriter json, string name, IReadOnlyList<FalsifiedClause> clauses, string where)
    {
        json.WriteStartArray(name);
        foreach (var clause in clauses)
        {
            json.WriteStartObject();
            json.WriteNumber("index", clause.Index);
            json.WriteString("kind", ReportWords.Of(clause.Origin.Kind));
            json.WriteStartArray("statements");
            foreach (var statement in clause.Origin.Statements)
            {
                json.WriteNumberValue(statement);
            }

            json.WriteEndArray();
            json.WriteString("origin", clause.Origin.ToString());
            json.WriteStartArray("literals");
            foreach (var literal in clause.Literals)
            {
                json.WriteNumberValue(literal);
            }

            json.WriteEndArray();
            json.WriteNumber("weight", ReportNumbers.Round(clause.Weight, $"{where}.{name}.weight"));
            json.WriteEndObject();
        }

        json.WriteEndArray();
    }

    private static void WriteShape(Utf8JsonWriter json, RunSettings settings)
    {
        var shape = settings.Shape;
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

    private static void WriteNullable(Utf8JsonWriter json, string name, double? value, string field)
    {
        if (value is { } v)
        {
            json.WriteNumber(name, ReportNumbers.Round(v, field));
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
