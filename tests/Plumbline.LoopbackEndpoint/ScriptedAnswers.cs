using System.Security.Cryptography;
using System.Text;

namespace Plumbline.LoopbackEndpoint;

/// <summary>
/// The endpoint's deterministic "model": every answer is a function of the request text, so two runs of
/// the same claims get the same responses. Statements are believed true or false by a hash of their
/// text, and a statement's negation (written by this model as "Not so: ...", or the engine's prefix
/// "It is not true that ...") gets the opposite belief, so every statement passes the integrity test
/// unless <see cref="FlatDepthOne"/> makes the claim's own explanations fail it (to grow depth 2).
/// </summary>
public sealed class ScriptedAnswers
{
    public const string NegationMarker = "Not so: ";
    public const string DepthOneMarker = "(first reason)";

    /// <summary>Explanations written for a claim are not integral, so each is expanded once more (a full-size tree).</summary>
    public bool FlatDepthOne { get; init; }

    /// <summary>P(True) for a statement.</summary>
    public double BeliefOf(string statement)
    {
        var text = statement.Trim();
        foreach (var prefix in new[] { NegationMarker, "It is not true that " })
        {
            if (text.StartsWith(prefix, StringComparison.Ordinal))
            {
                var inner = text[prefix.Length..];
                return FlatDepthOne && inner.Contains(DepthOneMarker, StringComparison.OrdinalIgnoreCase) ? 0.6 : 1 - BeliefOf(inner);
            }
        }

        if (FlatDepthOne && text.Contains(DepthOneMarker, StringComparison.OrdinalIgnoreCase))
        {
            return 0.7;
        }

        // 0.1 .. 0.9 away from 0.5: every plain statement is believed one way or the other.
        var h = Unit(text);
        return h < 0.5 ? 0.1 + h * 0.6 : 0.6 + (h - 0.5) * 0.6;
    }

    /// <summary>The i-th explanation of <paramref name="subject"/> for the given answer.</summary>
    public string Explanation(string subject, bool answer, int index)
    {
        var stem = subject.Trim().TrimEnd('.', '?', '!');
        var depthOne = !stem.Contains(DepthOneMarker, StringComparison.Ordinal) && !stem.StartsWith("Reason ", StringComparison.Ordinal);
        var tag = Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(stem)))[..6];
        return depthOne
            ? $" reason {index + 1} {(answer ? "for" : "against")} {tag} {DepthOneMarker}."
            : $" reason {index + 1} {(answer ? "for" : "against")} {tag} at depth two.";
    }

    public static string Negation(string statement) => " " + NegationMarker + statement.Trim();

    private static double Unit(string text)
    {
        var hash = SHA256.HashData(Encoding.UTF8.GetBytes(text));
        return BitConverter.ToUInt32(hash, 0) / (double)uint.MaxValue;
    }
}
