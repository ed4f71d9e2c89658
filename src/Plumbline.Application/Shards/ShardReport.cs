using Plumbline.Reports.Model;

namespace Plumbline.Application.Shards;

/// <summary>A shard's report and the file it was read from (for messages).</summary>
public sealed record ShardReport(string File, RunReport Report);
