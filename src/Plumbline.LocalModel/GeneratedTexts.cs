using Plumbline.Core.Language;

namespace Plumbline.LocalModel;

/// <summary>A generation's result with the token ids behind each text (for checks against references).</summary>
internal sealed record GeneratedTexts(GenerationResult Result, IReadOnlyList<int[]> Ids);
