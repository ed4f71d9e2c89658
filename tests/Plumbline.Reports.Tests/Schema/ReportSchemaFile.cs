using System.Text;
using System.Text.Json;
using Json.Schema;

namespace Plumbline.Reports.Tests.Schema;

/// <summary>
/// The committed report schema, found by walking up from the test assembly to the repository root
/// (the folder holding Plumbline.slnx). Self-contained so another test project can link this file
/// (<c>&lt;Compile Include="../Plumbline.Reports.Tests/Schema/ReportSchemaFile.cs" /&gt;</c>) and validate its own output.
/// </summary>
public static class ReportSchemaFile
{
    public const string SolutionFile = "Plumbline.slnx";

    /// <summary>The report version this build writes (kept here so that linking this file needs nothing else).</summary>
    public const int CurrentVersion = 2;

    private static readonly Lazy<(JsonSchema Report, JsonSchema Lines)> Schemas = new(() =>
    {
        var registry = new SchemaRegistry();
        var report = JsonSchema.FromText(File.ReadAllText(PathOf(CurrentVersion)), new BuildOptions { SchemaRegistry = registry });
        var lines = JsonSchema.FromText(File.ReadAllText(LinesPathOf(CurrentVersion)), new BuildOptions { SchemaRegistry = registry });
        return (report, lines);
    });

    public static string RepositoryRoot()
    {
        for (var folder = new DirectoryInfo(AppContext.BaseDirectory); folder is not null; folder = folder.Parent)
        {
            if (File.Exists(Path.Combine(folder.FullName, SolutionFile)))
            {
                return folder.FullName;
            }
        }

        throw new InvalidOperationException($"no {SolutionFile} above {AppContext.BaseDirectory}");
    }

    /// <summary>schemas/plumbline-report-{version}.schema.json under the repository root.</summary>
    public static string PathOf(int version) =>
        Path.Combine(RepositoryRoot(), "schemas", $"plumbline-report-{version}.schema.json");

    /// <summary>schemas/plumbline-lines-{version}.schema.json: one JSON Lines record.</summary>
    public static string LinesPathOf(int version) =>
        Path.Combine(RepositoryRoot(), "schemas", $"plumbline-lines-{version}.schema.json");

    /// <summary>Builds a schema in a registry of its own, so that building it twice never clashes on its $id.</summary>
    public static JsonSchema Build(string schemaText) =>
        JsonSchema.FromText(schemaText, new BuildOptions { SchemaRegistry = new SchemaRegistry() });

    /// <summary>Evaluates a document against the committed report schema, checking formats such as date-time too.</summary>
    public static EvaluationResults Evaluate(string json) => Evaluate(Schemas.Value.Report, json);

    /// <summary>Evaluates one JSON Lines record against the committed lines schema.</summary>
    public static EvaluationResults EvaluateLine(string line) => Evaluate(Schemas.Value.Lines, line);

    private static EvaluationResults Evaluate(JsonSchema schema, string json)
    {
        using var document = JsonDocument.Parse(json);
        return schema.Evaluate(document.RootElement, new EvaluationOptions
        {
            OutputFormat = OutputFormat.List,
            RequireFormatValidation = true,
        });
    }

    /// <summary>Every error with where it is, for an assertion message.</summary>
    public static string Describe(EvaluationResults results)
    {
        var text = new StringBuilder();
        foreach (var node in results.Details ?? [])
        {
            foreach (var error in node.Errors ?? new Dictionary<string, string>())
            {
                text.Append(node.InstanceLocation).Append(": ").Append(error.Key).Append(": ").AppendLine(error.Value);
            }
        }

        return text.ToString();
    }
}
