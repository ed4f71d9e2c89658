using System.Collections.Frozen;
using System.Diagnostics.CodeAnalysis;
using Plumbline.Reports.Html;
using Plumbline.Reports.Json;
using Plumbline.Reports.Junit;
using Plumbline.Reports.Markdown;
using Plumbline.Reports.Text;

namespace Plumbline.Reports;

/// <summary>
/// The formats a report can be written in, by name. Immutable: <see cref="With"/> returns a new
/// registry, so the default one can be shared and a test can add its own format without touching it.
/// </summary>
public sealed class ReportWriterRegistry
{
    private readonly FrozenDictionary<string, Func<ReportOptions, IReportWriter>> factories;

    private ReportWriterRegistry(IEnumerable<KeyValuePair<string, Func<ReportOptions, IReportWriter>>> entries)
    {
        factories = entries.ToFrozenDictionary(StringComparer.OrdinalIgnoreCase);
        Formats = [.. factories.Keys.Order(StringComparer.Ordinal)];
    }

    public static ReportWriterRegistry Empty { get; } = new([]);

    /// <summary>Every format Plumbline ships.</summary>
    public static ReportWriterRegistry Default { get; } = Empty
        .With(TextReportWriter.FormatName, options => new TextReportWriter(options.Colour))
        .With(JsonReportWriter.FormatName, _ => new JsonReportWriter())
        .With(JsonLinesReportWriter.FormatName, _ => new JsonLinesReportWriter())
        .With(MarkdownReportWriter.FormatName, _ => new MarkdownReportWriter())
        .With(JunitReportWriter.FormatName, options => new JunitReportWriter(options.JunitFailures))
        .With(HtmlReportWriter.FormatName, _ => new HtmlReportWriter());

    /// <summary>Known format names, sorted.</summary>
    public IReadOnlyList<string> Formats { get; }

    /// <summary>A registry that also knows <paramref name="format"/>; a name already known is replaced.</summary>
    public ReportWriterRegistry With(string format, Func<ReportOptions, IReportWriter> factory)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(format);
        ArgumentNullException.ThrowIfNull(factory);
        var entries = factories.Where(e => !string.Equals(e.Key, format, StringComparison.OrdinalIgnoreCase))
            .Append(KeyValuePair.Create(format.Trim().ToLowerInvariant(), factory));
        return new ReportWriterRegistry(entries);
    }

    /// <summary>A writer for <paramref name="format"/> (case ignored), or false when the name is unknown.</summary>
    public bool TryCreate(string format, ReportOptions options, [NotNullWhen(true)] out IReportWriter? writer)
    {
        ArgumentNullException.ThrowIfNull(format);
        ArgumentNullException.ThrowIfNull(options);
        writer = factories.TryGetValue(format.Trim(), out var factory) ? factory(options) : null;
        return writer is not null;
    }

    /// <summary>A writer for <paramref name="format"/>; an unknown name throws, listing the known ones.</summary>
    public IReportWriter Create(string format, ReportOptions? options = null) =>
        TryCreate(format, options ?? ReportOptions.Default, out var writer)
            ? writer
            : throw new ArgumentException(
                $"unknown report format '{format}'; known formats: {string.Join(", ", Formats)}", nameof(format));
}
