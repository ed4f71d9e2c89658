using System.Globalization;
using System.Text.Json;
using System.Text.RegularExpressions;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Language;
using Plumbline.Core.MaxSat;
using Plumbline.Core.Runs;
using Plumbline.Core.Trees;
using Plumbline.Reports.Model;

namespace Plumbline.Reports.Json;

/// <summary>
/// Reads a JSON report (or a JSON Lines report) of the current schema version back into the report model, so that
/// two runs can be compared and shard reports merged. Every field the writer writes is read; the figures are
/// recomputed from the claims (with the numbers the claims print, as the run itself folds them), the wall time
/// taken as written. A report of another schema version, or with a field missing or of the wrong type, is refused
/// with a <see cref="ReportReadException"/> naming the file and the field.
/// </summary>
public static partial class ReportJsonReader
{
    /// <summary>Reads the report in <paramref name="path"/>.</summary>
    /// <exception cref="ReportReadException">The file is not a report this version can read.</exception>
    /// <exception cref="FileNotFoundException">There is no such file.</exception>
    public static async Task<RunReport> ReadFileAsync(string path, CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        var text = await File.ReadAllTextAsync(path, cancellationToken);
        return Read(text, path);
    }

    /// <summary>Reads a report from its text; <paramref name="file"/> names it in errors.</summary>
    public static RunReport Read(string text, string file)
    {
        ArgumentNullException.ThrowIfNull(text);
        var firstLine = text.TrimStart().Split('\n', 2)[0];
        if (IsJsonLinesHead(firstLine))
        {
            return ReadLines(text, file);
        }

        using var document = Parse(text, file, lineOffset: 0);
        var root = new JsonField(document.RootElement, "", file);
        CheckVersion(root);
        var claims = root["claims"].Items().Select(ClaimOf).ToList();
        return ReportOf(root, root, claims);
    }

    private static RunReport ReadLines(string text, string file)
    {
        var lines = text.Split('\n');
        var documents = new List<JsonDocument>();
        try
        {
            JsonField? head = null, summary = null;
            var claims = new List<ClaimReport>();
            for (var i = 0; i < lines.Length; i++)
            {
                if (string.IsNullOrWhiteSpace(lines[i]))
                {
                    continue;
                }

                var document = Parse(lines[i], file, lineOffset: i);
                documents.Add(document);
                var record = new JsonField(document.RootElement, "", $"{file}:{i + 1}");
                switch (record["record"].String())
                {
                    case "run":
                        CheckVersion(record);
                        head = record;
                        break;
                    case "claim":
                        claims.Add(ClaimOf(record));
                        break;
                    case "summary":
                        summary = record;
                        break;
                    default:
                        throw record.Fail("record", $"unknown record '{record["record"].String()}'");
                }
            }

            if (head is null || summary is null)
            {
                throw new ReportReadException(file, head is null ? "no run record" : "no summary record (the run did not finish writing)");
            }

            return ReportOf(head.Value, summary.Value, claims);
        }
        finally
        {
            documents.ForEach(d => d.Dispose());
        }
    }

    private static RunReport ReportOf(JsonField head, JsonField summary, List<ClaimReport> claims)
    {
        var header = new RunHeader(
            head["schema_version"].Int(),
            head["plumbline_version"].String(),
            SettingsOf(head["settings"]),
            head["started"].Instant(),
            head["settings"]["pairs_listed"].Word<PairListing>(ReportWords.Of))
        {
            Input = head.Optional("input") is { } input ? InputOf(input) : null,
        };
        var tally = new RunTally();
        claims.ForEach(c => tally.Add(c.Tally()));
        var figures = tally.ToFigures(summary["figures"]["wall_time_ms"].Milliseconds());
        var gates = summary["gates"].Items().Select(g => new GateResult(
            g["name"].String(), g["value"].NullableNumber(), g["comparison"].String(), g["threshold"].Number(), g["passed"].Bool())).ToList();
        var completion = summary["completion"];
        return new RunReport(
            header,
            summary["finished"].Instant(),
            figures,
            gates,
            new RunCompletion(
                completion["stopped_because"].NullableString(),
                [.. completion["not_judged"].Items().Select(i => i.String())],
                [.. completion["problems"].Items().Select(p => new RunProblem(p["source"].String(), p["message"].String()))]),
            new ClaimReportList(claims));
    }

    private static void CheckVersion(JsonField root)
    {
        if (root.Element.ValueKind != JsonValueKind.Object || root.Optional("schema_version") is not { } version)
        {
            throw root.Fail("", "not a plumb report (no schema_version)");
        }

        var number = version.Element.ValueKind == JsonValueKind.Number && version.Element.TryGetInt32(out var v) ? v : (int?)null;
        if (number != RunHeader.CurrentSchemaVersion)
        {
            throw root.Fail("", string.Create(CultureInfo.InvariantCulture,
                $"report schema version {version.Element.GetRawText()}; this plumb reads version {RunHeader.CurrentSchemaVersion} (read it with the plumb that wrote it, or run again)"));
        }
    }

    private static RunInput InputOf(JsonField input) => new(
        input["name"].String(),
        input["claims"].Int(),
        input["digest"].String(),
        input.Optional("shard") is { } shard ? new ClaimShard(shard["index"].Int(), shard["count"].Int()) : null);

    private static RunSettings SettingsOf(JsonField settings)
    {
        var rules = settings["rules"];
        var shape = new TreeShape([.. settings["tree_shape"]["levels"].Items().Select(level => new LevelShape(
            level["width"].Int(),
            new Decoding(
                level["decoding"]["temperature"].Number(),
                level["decoding"]["top_p"].Number(),
                level["decoding"]["max_tokens"].Int(),
                [.. level["decoding"]["stop"].Items().Select(s => s.String())])))]);
        return new RunSettings(
            settings["model_source"].String(),
            settings["nli_model"].String(),
            shape,
            settings["negation_mode"].Word<NegationMode>(ReportWords.Of),
            settings["thresholds"]["contested_margin"].Number(),
            settings["weighting"].Word<ClauseWeighting>(ReportWords.Of),
            settings["weight_scale"]["factor"].Int(),
            settings["seed"].NullableInt(),
            settings["prompt_version"].String(),
            settings["solver"].String())
        {
            IntegrityGap = rules["integrity_gap"].Number(),
            BeliefForm = rules["belief_form"].Word<BeliefForm>(ReportWords.Of),
            LinkFloor = rules["link_floor"].Number(),
            Conflicts = rules["conflicts"].Word<ConflictRule>(ReportWords.Of),
            Contradictions = rules["contradictions"].Word<ContradictionCount>(ReportWords.Of),
            NliText = rules["nli_text"].Word<NliText>(ReportWords.Of),
            DiscardCutOff = rules["discard_cut_off"].Bool(),
            ExpandIntegralClaim = rules["expand_integral_claim"].Bool(),
            ClaimBelief = rules["claim_belief"].Bool(),
            DirectAnswer = rules["direct_answer"].Word<DirectAnswerRule>(ReportWords.Of),
            Samples = rules["samples"].Int(),
        };
    }

    private static ClaimReport ClaimOf(JsonField claim)
    {
        var statements = claim["statements"].Items().Select(s => new StatementReport(
            s["id"].Int(),
            s["text"].String(),
            s["negation"].String(),
            s["negation_from_model"].Bool(),
            s["depth"].Int(),
            s["parent"].NullableInt(),
            s["generated_for"].NullableBool(),
            s["integrity"].Word<Integrity>(ReportWords.Of),
            s["belief"].Number(),
            s["p_true"].Number(),
            s["p_true_of_negation"].Number(),
            s["kept"].Bool(),
            s["value"].NullableBool(),
            [.. s["links"].Items().Select(LinkOf)])).ToList();
        var timings = claim["timings_ms"];
        var tokens = claim["tokens"];
        var status = claim["solve_status"];
        var cost = claim["objective_cost"];
        return new ClaimReport(
            claim["id"].String(),
            claim["claim"].String(),
            claim["gold"].NullableBool(),
            [.. claim["tags"].Items().Select(t => t.String())],
            claim["answer"].NullableBool(),
            claim["direct_answer"].NullableBool(),
            claim["status"].Word<ClaimStatus>(ReportWords.Of),
            claim["margin"].Number(),
            claim["two_sided"].Bool(),
            claim["probabilities_estimated"].Bool(),
            statements,
            [.. claim["links"].Items().Select(LinkOf)],
            [.. claim["pairs"].Items().Select(p => new PairReport(
                p["first"].Int(), p["second"].Int(), ScoresOf(p["forward"]), ScoresOf(p["backward"]), p["linked"].Bool()))],
            [.. claim["falsified_clauses"].Items().Select(ClauseOf)],
            [.. claim["deciding_clauses"].Items().Select(ClauseOf)],
            status.IsNull ? null : status.Word<SolveStatus>(ReportWords.Of),
            cost.IsNull ? null : cost.Long(),
            claim["counts"]["integral"].Int(),
            claim["counts"]["pruned"].Int(),
            claim["model_calls"].Int(),
            new TokenUsage(tokens["prompt"].Int(), tokens["completion"].Int()),
            new VerdictTimings(timings["tree"].Milliseconds(), timings["nli"].Milliseconds(), timings["solve"].Milliseconds()),
            claim["error"].NullableString())
        {
            Position = claim.Optional("position")?.Int(),
            PairedDirectAnswer = claim["paired_direct_answer"].NullableBool(),
            NormalisedMargin = claim["normalised_margin"].Number(),
            Conflicts = [.. claim["conflicts"].Items().Select(c => new LinkConflict(LinkOf(c["entailment"]), LinkOf(c["contradiction"]), c["dropped"].Bool()))],
            CutOffDiscarded = claim["counts"]["cut_off_discarded"].Int(),
            Stability = claim.Optional("stability") is { } stability
                ? new SampleAgreement(stability["trees"].Int(), stability["agreeing"].Int(), stability["tied"].Bool())
                : null,
        };
    }

    private static Link LinkOf(JsonField link) => new(
        link["from"].Int(),
        link["to"].Int(),
        link["kind"].Word<EntailmentKind>(ReportWords.Of),
        link["probability"].Number(),
        link["from_negation"].Bool(),
        link["to_negation"].Bool());

    private static EntailmentScores ScoresOf(JsonField scores) =>
        new(scores["entailment"].Number(), scores["neutral"].Number(), scores["contradiction"].Number());

    private static FalsifiedClause ClauseOf(JsonField clause) => new(
        clause["index"].Int(),
        OriginOf(clause["kind"].Word<ClauseKind>(ReportWords.Of), clause["origin"]),
        [.. clause["literals"].Items().Select(l => l.Int())],
        clause["weight"].Number());

    /// <summary>Reads back <see cref="ClauseOrigin.ToString"/>: "belief: #3", "~#1 entails #0", "#2 contradicts ~#4", "pin: #0 = true".</summary>
    private static ClauseOrigin OriginOf(ClauseKind kind, JsonField origin)
    {
        var text = origin.String();
        int Number(Group group) => int.Parse(group.Value, CultureInfo.InvariantCulture);
        switch (kind)
        {
            case ClauseKind.Belief when BeliefOrigin().Match(text) is { Success: true } belief:
                return ClauseOrigin.Belief(Number(belief.Groups["a"]));
            case ClauseKind.Pin when PinOrigin().Match(text) is { Success: true } pin:
                return ClauseOrigin.Pin(Number(pin.Groups["a"]), pin.Groups["value"].Value == "true");
            case ClauseKind.Entailment or ClauseKind.Contradiction when LinkOrigin().Match(text) is { Success: true } link
                && link.Groups["verb"].Value == (kind == ClauseKind.Entailment ? "entails" : "contradicts"):
                return new ClauseOrigin(kind, Number(link.Groups["a"]), Number(link.Groups["b"]),
                    StatementNegated: link.Groups["na"].Success, OtherNegated: link.Groups["nb"].Success);
            default:
                throw origin.Fail(origin.Path, $"'{text}' is not a {ReportWords.Of(kind)} clause's origin");
        }
    }

    private static bool IsJsonLinesHead(string line)
    {
        try
        {
            using var document = JsonDocument.Parse(line);
            return document.RootElement.ValueKind == JsonValueKind.Object
                && document.RootElement.TryGetProperty("record", out var record)
                && record.ValueKind == JsonValueKind.String;
        }
        catch (JsonException)
        {
            return false;
        }
    }

    private static JsonDocument Parse(string text, string file, int lineOffset)
    {
        try
        {
            return JsonDocument.Parse(text);
        }
        catch (JsonException e)
        {
            var line = (e.LineNumber ?? 0) + 1 + lineOffset;
            throw new ReportReadException(string.Create(CultureInfo.InvariantCulture, $"{file}:{line}"), "not valid JSON");
        }
    }

    [GeneratedRegex(@"^belief: #(?<a>\d+)$")]
    private static partial Regex BeliefOrigin();

    [GeneratedRegex(@"^pin: #(?<a>\d+) = (?<value>true|false)$")]
    private static partial Regex PinOrigin();

    [GeneratedRegex(@"^(?<na>~)?#(?<a>\d+) (?<verb>entails|contradicts) (?<nb>~)?#(?<b>\d+)$")]
    private static partial Regex LinkOrigin();
}
