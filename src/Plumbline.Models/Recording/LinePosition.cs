namespace Plumbline.Models.Recording;

/// <summary>Where one line of a recording file lies: its first byte, its length in bytes without the line end,
/// and its 1-based number (blank lines counted, as error messages count them).</summary>
/// <remarks>Offset first so that the struct packs into 16 bytes: the index keeps one per recorded request.</remarks>
internal readonly record struct LinePosition(long Offset, int Length, int Number);
