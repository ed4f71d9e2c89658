using System.Text.Json;
using Plumbline.Core.Coherence;
using Plumbline.Core.Entailment;
using Plumbline.Core.Runs;
using Plumbline.Reports.Json;
using Plumbline.Reports.Model;
using Plumbline.Reports.Tests.Fixtures;
using Plumbline.Reports.Tests.Schema;

namespace Plumbline.Reports.Tests.Json;

public sealed class JsonReportWriterTests
{
    private static async Task<JsonDocument> WriteAsync(RunReport report) =>
        JsonDocument.Parse(await ReportOutput.TextAsync(new JsonReportWriter(), report));

    private static JsonElement Claim(JsonDocument document, int index) => document.RootElement.GetProperty("claims")[index];

    private static string Ids(JsonElement array) => string.Join(' ', array.EnumerateArray().Select(e => e.GetInt32()));

    [Fact]
    public async Task WriteAsync_MixedReport_ValidatesAgainstSchema()
    {
        var results = ReportSchemaFile.Evaluate(await ReportOutput.TextAsync(new JsonReportWriter(), SampleReports.Mixed()));

        Assert.True(results.IsValid, ReportSchemaFile.Describe(results));
    }

    [Fact]
    public async Task WriteAsync_ReportWithoutGold_ValidatesWithNullAccuracies()
    {
        var json = await ReportOutput.TextAsync(new JsonReportWriter(), SampleReports.WithoutGold());
        using var document = JsonDocument.Parse(json);
        var figures = document.RootElement.GetProperty("figures");

        var results = ReportSchemaFile.Evaluate(json);
        Assert.True(results.IsValid, ReportSchemaFile.Describe(results));
        Assert.Equal(JsonValueKind.Null, figures.GetProperty("direct_accuracy").ValueKind);
        Assert.Equal(JsonValueKind.Null, figures.GetProperty("coherent_accuracy").ValueKind);
        Assert.Equal(JsonValueKind.Null, Claim(document, 0).GetProperty("gold").ValueKind);
    }

    [Fact]
    public async Task WriteAsync_TopLevel_SnakeCaseNamesInFixedOrder()
    {
        using var document = await WriteAsync(SampleReports.Mixed());

        string[] expected = ["schema_version", "plumbline_version", "notice", "settings", "started", "finished", "figures", "gates", "completion", "claims"];
        Assert.Equal(expected, document.RootElement.EnumerateObject().Select(p => p.Name));
        Assert.Equal(2, document.RootElement.GetProperty("schema_version").GetInt32());
        Assert.Equal(ReportNotice.Text, document.RootElement.GetProperty("notice").GetString());
    }

    [Fact]
    public async Task WriteAsync_ClaimEntry_SnakeCaseNamesInFixedOrder()
    {
        using var document = await WriteAsync(SampleReports.Mixed());

        string[] expected =
        [
            "id", "claim", "gold", "tags", "answer", "direct_answer", "paired_direct_answer", "status", "margin", "normalised_margin", "stability", "two_sided",
            "probabilities_estimated", "counts", "statements", "links", "pairs", "conflicts", "falsified_clauses", "deciding_clauses", "solve_status",
            "objective_cost", "model_calls", "tokens", "timings_ms", "error",
        ];
        Assert.Equal(expected, Claim(document, 0).EnumerateObject().Select(p => p.Name));
    }

    [Fact]
    public async Task WriteAsync_LinkScoredOnANegation_FlagsTheNegatedSide()
    {
        var verdict = SampleReports.Settled with { Links = [new Link(2, 0, EntailmentKind.Contradiction, 0.95, FromNegation: true)] };
        var json = await ReportOutput.TextAsync(new JsonReportWriter(), SampleReports.Report([verdict], SampleReports.Started.AddSeconds(1)));
        using var document = JsonDocument.Parse(json);

        var link = Claim(document, 0).GetProperty("links")[0];
        Assert.True(link.GetProperty("from_negation").GetBoolean());
        Assert.False(link.GetProperty("to_negation").GetBoolean());
        var results = ReportSchemaFile.Evaluate(json);
        Assert.True(results.IsValid, ReportSchemaFile.Describe(results));
    }

    [Fact]
    public async Task WriteAsync_Statuses_AreVocabularyWords()
    {
        using var document = await WriteAsync(SampleReports.Mixed());

        Assert.Equal(["settled", "overturned", "failed"],
            document.RootElement.GetProperty("claims").EnumerateArray().Select(c => c.GetProperty("status").GetString()));
    }

    [Fact]
    public async Task WriteAsync_Numbers_RoundedToFourDecimals()
    {
        var json = await ReportOutput.TextAsync(new JsonReportWriter(), SampleReports.Mixed());
        using var document = JsonDocument.Parse(json);
        var settled = Claim(document, 0);

        Assert.Equal("1.2346", settled.GetProperty("margin").GetRawText());
        Assert.Equal("0.9877", settled.GetProperty("links")[1].GetProperty("probability").GetRawText());
        Assert.Equal("0.1304", settled.GetProperty("falsified_clauses")[0].GetProperty("weight").GetRawText());
        // belief 0.91 / (0.91 + 0.07) = 0.928571...
        Assert.Equal("0.9286", settled.GetProperty("statements")[0].GetProperty("belief").GetRawText());
        Assert.Equal("812.3", settled.GetProperty("timings_ms").GetProperty("tree").GetRawText());
        Assert.Equal("855.7", settled.GetProperty("timings_ms").GetProperty("total").GetRawText());
        Assert.DoesNotContain("0.987654", json, StringComparison.Ordinal);
    }

    [Fact]
    public async Task WriteAsync_Statements_CarryIntegrityParentsAndKeptFlag()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var statements = Claim(document, 0).GetProperty("statements");

        Assert.Equal(["true", "true", "false", "no"], statements.EnumerateArray().Select(s => s.GetProperty("integrity").GetString()));
        Assert.Equal(JsonValueKind.Null, statements[0].GetProperty("parent").ValueKind);
        Assert.Equal(JsonValueKind.Null, statements[0].GetProperty("generated_for").ValueKind);
        Assert.Equal(0, statements[2].GetProperty("parent").GetInt32());
        Assert.False(statements[2].GetProperty("generated_for").GetBoolean());
        Assert.False(statements[3].GetProperty("kept").GetBoolean());
        var counts = Claim(document, 0).GetProperty("counts");
        Assert.Equal((4, 3, 1, 3), (counts.GetProperty("statements").GetInt32(), counts.GetProperty("kept").GetInt32(),
            counts.GetProperty("pruned").GetInt32(), counts.GetProperty("integral").GetInt32()));
    }

    [Fact]
    public async Task WriteAsync_Links_KindsAsWords()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var links = Claim(document, 0).GetProperty("links");

        Assert.Equal(["entailment", "contradiction"], links.EnumerateArray().Select(l => l.GetProperty("kind").GetString()));
        Assert.Equal((2, 0), (links[1].GetProperty("from").GetInt32(), links[1].GetProperty("to").GetInt32()));
    }

    [Fact]
    public async Task WriteAsync_FailedClaim_NullAnswerAndReason()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var failed = Claim(document, 2);

        Assert.Equal(JsonValueKind.Null, failed.GetProperty("answer").ValueKind);
        Assert.Equal(JsonValueKind.Null, failed.GetProperty("solve_status").ValueKind);
        Assert.Equal(SampleReports.FailureReason, failed.GetProperty("error").GetString());
        Assert.Equal(0, failed.GetProperty("statements").GetArrayLength());
        Assert.Equal(2, failed.GetProperty("model_calls").GetInt32());
    }

    [Fact]
    public async Task WriteAsync_JudgedClaim_AnswersSolveStatusAndCost()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var overturned = Claim(document, 1);

        Assert.False(overturned.GetProperty("answer").GetBoolean());
        Assert.True(overturned.GetProperty("direct_answer").GetBoolean());
        Assert.False(overturned.GetProperty("gold").GetBoolean());
        Assert.Equal("optimal", overturned.GetProperty("solve_status").GetString());
        Assert.Equal(612, overturned.GetProperty("objective_cost").GetInt64());
        Assert.True(overturned.GetProperty("probabilities_estimated").GetBoolean());
        Assert.Equal(JsonValueKind.Null, overturned.GetProperty("error").ValueKind);
    }

    [Fact]
    public async Task WriteAsync_Times_UtcIso8601()
    {
        using var document = await WriteAsync(SampleReports.Mixed());

        // The fixture starts at 10:30 on a +02:00 clock.
        Assert.Equal("2025-03-01T08:30:00.000Z", document.RootElement.GetProperty("started").GetString());
        Assert.Equal("2025-03-01T08:30:04.500Z", document.RootElement.GetProperty("finished").GetString());
        Assert.Equal("4500", document.RootElement.GetProperty("figures").GetProperty("wall_time_ms").GetRawText());
    }

    [Fact]
    public async Task WriteAsync_Figures_AccuraciesWithWilsonIntervals()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var figures = document.RootElement.GetProperty("figures");
        var direct = figures.GetProperty("direct_accuracy");
        var coherent = figures.GetProperty("coherent_accuracy");

        // Wilson 95% bounds for 1 of 2 and 2 of 2, worked by hand from the score-interval formula (common practice).
        Assert.Equal((1, 2, 0.5), (direct.GetProperty("correct").GetInt32(), direct.GetProperty("labelled").GetInt32(), direct.GetProperty("value").GetDouble()));
        Assert.Equal(0.0945, direct.GetProperty("wilson_95").GetProperty("low").GetDouble(), 4);
        Assert.Equal(0.9055, direct.GetProperty("wilson_95").GetProperty("high").GetDouble(), 4);
        Assert.Equal(1.0, coherent.GetProperty("value").GetDouble());
        Assert.Equal(0.3424, coherent.GetProperty("wilson_95").GetProperty("low").GetDouble(), 4);
        Assert.Equal(1.0, coherent.GetProperty("wilson_95").GetProperty("high").GetDouble());
        Assert.Equal("0.5", figures.GetProperty("overturn_rate").GetRawText());
        Assert.Equal("0.8673", figures.GetProperty("mean_margin").GetRawText());
        Assert.Equal(1, figures.GetProperty("links").GetProperty("entailment").GetInt32());
        Assert.Equal(3, figures.GetProperty("links").GetProperty("contradiction").GetInt32());
        Assert.Equal(27, figures.GetProperty("model_calls").GetInt32());
        Assert.Equal(2010, figures.GetProperty("tokens").GetProperty("total").GetInt32());
    }

    [Fact]
    public async Task WriteAsync_Settings_AsUsedWithScaleExplained()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var settings = document.RootElement.GetProperty("settings");

        Assert.Equal("plumb-nli-small sha256:0123abcd", settings.GetProperty("nli_model").GetString());
        Assert.Equal("model", settings.GetProperty("negation_mode").GetString());
        Assert.Equal("unit", settings.GetProperty("weighting").GetString());
        Assert.Equal(1000, settings.GetProperty("weight_scale").GetProperty("factor").GetInt32());
        Assert.Contains("clause-weight units", settings.GetProperty("weight_scale").GetProperty("meaning").GetString(), StringComparison.Ordinal);
        Assert.Equal(7, settings.GetProperty("seed").GetInt32());
        var levels = settings.GetProperty("tree_shape").GetProperty("levels");
        Assert.Equal(2, levels.GetArrayLength());
        Assert.Equal(3, levels[0].GetProperty("width").GetInt32());
        Assert.True(levels[1].GetProperty("decoding").GetProperty("greedy").GetBoolean());
    }

    [Fact]
    public async Task WriteAsync_SameReportTwice_IdenticalBytes()
    {
        var report = SampleReports.Mixed();

        var first = await ReportOutput.BytesAsync(new JsonReportWriter(), report);
        var second = await ReportOutput.BytesAsync(new JsonReportWriter(), report);

        Assert.Equal(first, second);
        Assert.NotEqual(0xEF, first[0]); // no byte-order mark
        Assert.Equal((byte)'\n', first[^1]);
    }

    [Fact]
    public async Task WriteAsync_Stream_LeftOpen()
    {
        using var stream = new MemoryStream();

        await new JsonReportWriter().WriteAsync(SampleReports.Mixed(), stream, CancellationToken.None);

        Assert.True(stream.CanWrite);
    }

    [Fact]
    public async Task WriteAsync_NotANumberMargin_ThrowsNamingTheField()
    {
        var broken = SampleReports.Report([SampleReports.Settled with { Margin = double.NaN }], SampleReports.Started.AddSeconds(1));

        var error = await Assert.ThrowsAsync<ArgumentException>(() => ReportOutput.BytesAsync(new JsonReportWriter(), broken));

        // The summary (with the mean margin) precedes the claims, so the run-level field is the first to refuse it.
        Assert.Contains("figures.mean_margin", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task WriteAsync_Statements_ValueInTheOptimumAndTheLinksTouchingEach()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var statements = Claim(document, 0).GetProperty("statements");

        // The fixture's optimum: #0 true, #1 true, #2 false; #3 was pruned and has no value.
        Assert.Equal(["True", "True", "False", "Null"], statements.EnumerateArray().Select(s => s.GetProperty("value").ValueKind.ToString()));
        // #0 is touched by both links, #1 by the entailment only, #3 by none.
        Assert.Equal([(1, 0), (2, 0)], statements[0].GetProperty("links").EnumerateArray().Select(l => (l.GetProperty("from").GetInt32(), l.GetProperty("to").GetInt32())));
        Assert.Equal(["entailment"], statements[1].GetProperty("links").EnumerateArray().Select(l => l.GetProperty("kind").GetString()));
        Assert.Equal(0, statements[3].GetProperty("links").GetArrayLength());
    }

    [Fact]
    public async Task WriteAsync_Pairs_EachLinkedPairOnceWithBothDirections()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var pairs = Claim(document, 0).GetProperty("pairs");

        // Linked pairs of the settled claim: {0,1} (1 -> 0 entails) and {0,2} (2 -> 0 contradicts); {1,2} has no link.
        Assert.Equal([(0, 1), (0, 2)], pairs.EnumerateArray().Select(p => (p.GetProperty("first").GetInt32(), p.GetProperty("second").GetInt32())));
        var contradiction = pairs[1];
        Assert.Equal("contradiction", contradiction.GetProperty("forward").GetProperty("label").GetString());
        Assert.Equal("0.91", contradiction.GetProperty("forward").GetProperty("contradiction").GetRawText());
        Assert.Equal("0.9877", contradiction.GetProperty("backward").GetProperty("contradiction").GetRawText());
        Assert.Equal("neutral", pairs[0].GetProperty("forward").GetProperty("label").GetString());
        Assert.Equal("entailment", pairs[0].GetProperty("backward").GetProperty("label").GetString());
    }

    [Fact]
    public async Task WriteAsync_VerboseListing_AllThreePairs()
    {
        using var document = await WriteAsync(SampleReports.Report([SampleReports.Settled], SampleReports.Started.AddSeconds(1), PairListing.All));

        var pairs = Claim(document, 0).GetProperty("pairs");
        Assert.Equal(3, pairs.GetArrayLength());
        Assert.False(pairs[2].GetProperty("linked").GetBoolean());
        Assert.Equal("all", document.RootElement.GetProperty("settings").GetProperty("pairs_listed").GetString());
    }

    [Fact]
    public async Task WriteAsync_Clauses_TypedWithTheirStatements()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var settled = Claim(document, 0);

        var falsified = Assert.Single(settled.GetProperty("falsified_clauses").EnumerateArray());
        Assert.Equal(("belief", "2"), (falsified.GetProperty("kind").GetString(), Ids(falsified.GetProperty("statements"))));
        // Of the two clauses the other answer breaks, only "#1 entails #0" is kept by the optimum: it decided.
        var deciding = Assert.Single(settled.GetProperty("deciding_clauses").EnumerateArray());
        Assert.Equal(("entailment", "1 0", "#1 entails #0"),
            (deciding.GetProperty("kind").GetString(), Ids(deciding.GetProperty("statements")), deciding.GetProperty("origin").GetString()));
    }

    [Fact]
    public async Task WriteAsync_GatesAndCompletion_AsGiven()
    {
        var completion = new RunCompletion("interrupted", ["c4", "c5"], [new RunProblem("input", "claims.jsonl:3: gold: unknown label 'maybe'")]);
        var gates = new[] { new GateResult("coherent_accuracy", 0.5, ">=", 0.75, false) };
        var report = SampleReports.Report([SampleReports.Settled], SampleReports.Started.AddSeconds(1), completion: completion, gates: gates);
        var json = await ReportOutput.TextAsync(new JsonReportWriter(), report);
        using var document = JsonDocument.Parse(json);

        var gate = Assert.Single(document.RootElement.GetProperty("gates").EnumerateArray());
        Assert.Equal(("coherent_accuracy", 0.5, ">=", 0.75, false),
            (gate.GetProperty("name").GetString(), gate.GetProperty("value").GetDouble(), gate.GetProperty("comparison").GetString(),
             gate.GetProperty("threshold").GetDouble(), gate.GetProperty("passed").GetBoolean()));
        var written = document.RootElement.GetProperty("completion");
        Assert.False(written.GetProperty("complete").GetBoolean());
        Assert.Equal("interrupted", written.GetProperty("stopped_because").GetString());
        Assert.Equal(["c4", "c5"], written.GetProperty("not_judged").EnumerateArray().Select(e => e.GetString()));
        Assert.Equal("input", written.GetProperty("problems")[0].GetProperty("source").GetString());
        Assert.True(ReportSchemaFile.Evaluate(json).IsValid, ReportSchemaFile.Describe(ReportSchemaFile.Evaluate(json)));
    }

    [Fact]
    public async Task WriteAsync_MethodFields_StabilityNormalisedMarginConflictsAndCutOffs()
    {
        using var document = await WriteAsync(SampleReports.Mixed());
        var (settled, overturned, figures) = (Claim(document, 0), Claim(document, 1), document.RootElement.GetProperty("figures"));

        Assert.Equal("0.3086", settled.GetProperty("normalised_margin").GetRawText());
        Assert.Equal((3, 2, false), (settled.GetProperty("stability").GetProperty("trees").GetInt32(),
            settled.GetProperty("stability").GetProperty("agreeing").GetInt32(), settled.GetProperty("stability").GetProperty("tied").GetBoolean()));
        Assert.Equal(JsonValueKind.Null, overturned.GetProperty("stability").ValueKind);
        Assert.False(overturned.GetProperty("paired_direct_answer").GetBoolean());
        var conflict = Assert.Single(overturned.GetProperty("conflicts").EnumerateArray());
        Assert.True(conflict.GetProperty("dropped").GetBoolean());
        Assert.Equal((1, 0), (conflict.GetProperty("contradiction").GetProperty("from").GetInt32(), conflict.GetProperty("contradiction").GetProperty("to").GetInt32()));
        Assert.Equal(1, settled.GetProperty("counts").GetProperty("cut_off_discarded").GetInt32());
        // (0.30864 + 0.125) / 2 = 0.21682; stability 2 / 3 on the one claim that sampled trees.
        Assert.Equal("0.2168", figures.GetProperty("mean_normalised_margin").GetRawText());
        Assert.Equal("0.6667", figures.GetProperty("mean_stability").GetRawText());
        Assert.Equal((1, 1, 1), (figures.GetProperty("conflicting_pairs").GetInt32(), figures.GetProperty("cut_off_discarded").GetInt32(),
            figures.GetProperty("estimated_claims").GetInt32()));
    }

    [Fact]
    public async Task WriteAsync_CancelledToken_Throws()
    {
        using var stream = new MemoryStream();

        await Assert.ThrowsAnyAsync<OperationCanceledException>(
            () => new JsonReportWriter().WriteAsync(SampleReports.Mixed(), stream, new CancellationToken(canceled: true)));
    }
}
