using Plumbline.Core.Language;

namespace Plumbline.Core.Trees;

/// <summary>How one depth of the tree is grown: explanations per answer and per expanded parent, and their decoding.</summary>
public sealed record LevelShape(int Width, Decoding Decoding);
