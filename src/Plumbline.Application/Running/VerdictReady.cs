using Plumbline.Core.Coherence;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>
/// One claim is finished, in input order. The verdict (with its tree and MAX-SAT problem) lives only as long as
/// the sinks take to handle this event; what outlasts it is the claim's report.
/// </summary>
/// <param name="Verdict">The engine's verdict.</param>
/// <param name="Report">What the reports show of it.</param>
/// <param name="Position">1 for the first claim of the run.</param>
public sealed record VerdictReady(Verdict Verdict, ClaimReport Report, int Position);
