using System.Text;

namespace Plumbline.Core.Language;

/// <summary>
/// Who answers: the kind of backend, the model's name and every setting that changes what the model
/// says (endpoint, protocol, seed, how answer probabilities are obtained ...). Part of every cache key,
/// so one model's answers are never served for another's. Parameters are compared and hashed in
/// ordinal order of their names, whatever order they were given in.
/// </summary>
public sealed record ModelIdentity
{
    public ModelIdentity(string kind, string name, IEnumerable<KeyValuePair<string, string>>? parameters = null)
    {
        ArgumentException.ThrowIfNullOrEmpty(kind);
        ArgumentNullException.ThrowIfNull(name);
        Kind = kind;
        Name = name;
        Parameters = (parameters ?? []).OrderBy(p => p.Key, StringComparer.Ordinal).ToArray();
        if (Parameters.Select(p => p.Key).Distinct(StringComparer.Ordinal).Count() != Parameters.Count)
        {
            throw new ArgumentException("a model identity parameter is given twice", nameof(parameters));
        }

        CanonicalJson = Canonical(Kind, Name, Parameters);
        Key = RequestFingerprint.HashOf(CanonicalJson);
    }

    /// <summary>The source kind: "http", "recording", "local" ...</summary>
    public string Kind { get; }

    /// <summary>The model's name as the backend knows it.</summary>
    public string Name { get; }

    /// <summary>Settings that change the answers, sorted by name.</summary>
    public IReadOnlyList<KeyValuePair<string, string>> Parameters { get; }

    /// <summary><c>{"kind":...,"name":...,"parameters":{...}}</c> without whitespace.</summary>
    public string CanonicalJson { get; }

    /// <summary>Lower-case hex SHA-256 of <see cref="CanonicalJson"/>.</summary>
    public string Key { get; }

    public bool Equals(ModelIdentity? other) => other is not null && CanonicalJson == other.CanonicalJson;

    public override int GetHashCode() => StringComparer.Ordinal.GetHashCode(CanonicalJson);

    public override string ToString() => CanonicalJson;

    private static string Canonical(string kind, string name, IReadOnlyList<KeyValuePair<string, string>> parameters)
    {
        var json = new StringBuilder(128);
        json.Append('{');
        CanonicalJsonWriter.Field(json, "kind", first: true); CanonicalJsonWriter.Text(json, kind);
        CanonicalJsonWriter.Field(json, "name"); CanonicalJsonWriter.Text(json, name);
        CanonicalJsonWriter.Field(json, "parameters");
        json.Append('{');
        for (var i = 0; i < parameters.Count; i++)
        {
            CanonicalJsonWriter.Field(json, parameters[i].Key, first: i == 0);
            CanonicalJsonWriter.Text(json, parameters[i].Value ?? throw new ArgumentException("a parameter value is null", nameof(parameters)));
        }

        json.Append("}}");
        return json.ToString();
    }
}
