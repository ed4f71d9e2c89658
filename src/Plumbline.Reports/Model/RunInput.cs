using Plumbline.Core.Claims;

namespace Plumbline.Reports.Model;

/// <summary>The claim input a run read, so that reports of one input (shards of it, or two runs to compare) can be told apart from reports of another.</summary>
/// <param name="Name">The file as given, "stdin" or "command line".</param>
/// <param name="Claims">Usable claims in the whole input, not only the shard judged.</param>
/// <param name="Digest">"sha256:" and the hex SHA-256 of the usable claims (id, text, gold label, tags) in input order.</param>
/// <param name="Shard">The shard the run judged; null when it judged every claim.</param>
public sealed record RunInput(string Name, int Claims, string Digest, ClaimShard? Shard);
