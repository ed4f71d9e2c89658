using System.Runtime.CompilerServices;

// Writers are internal; their tests exercise them directly rather than only through the registry.
[assembly: InternalsVisibleTo("Plumbline.Reports.Tests")]
