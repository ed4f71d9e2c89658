namespace Plumbline.Core.Coherence;

/// <summary>Readable names for why a clause exists; statement ids are written "#id", a negation's text "~#id".</summary>
public static class ClauseOrigin
{
    public static string Belief(int statementId) => $"belief: #{statementId}";

    public static string Entails(int from, int to) => $"#{from} entails #{to}";

    public static string Contradicts(int from, int to) => $"#{from} contradicts #{to}";

    public static string Entails(Link link) => $"{Side(link.From, link.FromNegation)} entails {Side(link.To, link.ToNegation)}";

    public static string Contradicts(Link link) => $"{Side(link.From, link.FromNegation)} contradicts {Side(link.To, link.ToNegation)}";

    public static string Pin(int statementId, bool value) => $"pin: #{statementId} = {(value ? "true" : "false")}";

    private static string Side(int statementId, bool negated) => negated ? $"~#{statementId}" : $"#{statementId}";
}
