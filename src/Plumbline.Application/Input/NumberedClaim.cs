using Plumbline.Core.Claims;

namespace Plumbline.Application.Input;

/// <summary>A usable claim and its place among all the usable claims of its input, from 1.</summary>
public sealed record NumberedClaim(int Position, Claim Claim);
