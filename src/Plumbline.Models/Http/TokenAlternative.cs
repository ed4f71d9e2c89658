namespace Plumbline.Models.Http;

/// <summary>One candidate for a generated token and its natural-log probability, as an endpoint lists it.</summary>
public readonly record struct TokenAlternative(string Token, double LogProbability);
