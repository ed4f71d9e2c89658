namespace Plumbline.Core.Language;

/// <summary>Ask for the model's probability of "True" versus "False" for one statement.</summary>
public sealed record AnswerRequest(string Statement, string Prompt);
