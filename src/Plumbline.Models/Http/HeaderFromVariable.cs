namespace Plumbline.Models.Http;

/// <summary>An extra request header whose value is read from an environment variable, so that a secret
/// never has to appear on a command line.</summary>
public sealed record HeaderFromVariable(string Name, string Variable);
