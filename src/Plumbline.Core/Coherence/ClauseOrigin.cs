using System.Globalization;
using System.Text.Json.Serialization;

namespace Plumbline.Core.Coherence;

/// <summary>
/// Why a clause exists, as data: its kind, the statement it is about and, for a link, the other statement.
/// <see cref="ToString"/> gives the readable form ("belief: #3", "#2 entails #5", "#2 contradicts #5", and
/// "~#2" for a statement scored by its negation's text) that WCNF comments and reports print; readers that
/// need the statements use the fields instead of parsing it.
/// </summary>
/// <param name="Kind">Belief, entailment, contradiction or pin.</param>
/// <param name="Statement">The statement of a belief or pin clause; the premise of a link.</param>
/// <param name="Other">The hypothesis of a link; null otherwise.</param>
/// <param name="Value">The value a pin fixes; null otherwise.</param>
/// <param name="StatementNegated">The link's premise was its negation's text.</param>
/// <param name="OtherNegated">The link's hypothesis was its negation's text.</param>
public sealed record ClauseOrigin(ClauseKind Kind, int Statement, int? Other = null, bool? Value = null, bool StatementNegated = false, bool OtherNegated = false)
{
    public static ClauseOrigin Belief(int statementId) => new(ClauseKind.Belief, statementId);

    public static ClauseOrigin Entails(int from, int to) => new(ClauseKind.Entailment, from, to);

    public static ClauseOrigin Contradicts(int from, int to) => new(ClauseKind.Contradiction, from, to);

    /// <summary>The clause of a link, with the sides scored by their negation's text marked.</summary>
    public static ClauseOrigin Of(Link link) => new(
        link.Kind == Entailment.EntailmentKind.Entailment ? ClauseKind.Entailment : ClauseKind.Contradiction,
        link.From, link.To, StatementNegated: link.FromNegation, OtherNegated: link.ToNegation);

    public static ClauseOrigin Pin(int statementId, bool value) => new(ClauseKind.Pin, statementId, Value: value);

    /// <summary>The statements the clause mentions, premise first.</summary>
    [JsonIgnore]
    public IReadOnlyList<int> Statements => Other is { } other ? [Statement, other] : [Statement];

    public override string ToString() => Kind switch
    {
        ClauseKind.Belief => string.Create(CultureInfo.InvariantCulture, $"belief: #{Statement}"),
        ClauseKind.Entailment => $"{Side(Statement, StatementNegated)} entails {Side(Other ?? 0, OtherNegated)}",
        ClauseKind.Contradiction => $"{Side(Statement, StatementNegated)} contradicts {Side(Other ?? 0, OtherNegated)}",
        _ => string.Create(CultureInfo.InvariantCulture, $"pin: #{Statement} = {(Value == true ? "true" : "false")}"),
    };

    private static string Side(int statementId, bool negated) =>
        (negated ? "~#" : "#") + statementId.ToString(CultureInfo.InvariantCulture);
}
