using System.Runtime.CompilerServices;

// The tree and clause builders are internal; their tests exercise them directly.
[assembly: InternalsVisibleTo("Plumbline.Core.Tests")]
