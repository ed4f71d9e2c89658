using ArchUnitNET.Domain;
using ArchUnitNET.Fluent;
using ArchUnitNET.Fluent.Syntax.Elements.Types;
using ArchUnitNET.Loader;
using ArchUnitNET.xUnit;
using Plumbline.Core.Coherence;
using Plumbline.LocalModel;
using Plumbline.Models.Recording;
using Plumbline.Nli;
using Plumbline.Reports;
using Plumbline.Solver;
using static ArchUnitNET.Fluent.ArchRuleDefinition;

namespace Plumbline.Cli.Tests.Architecture;

/// <summary>
/// Dependencies point into Core, adapters never reach each other, and Core does no I/O. Each forbidding rule
/// is paired with a check that the loader sees the kind of dependency the rule looks for, so a rule cannot
/// pass merely because nothing was loaded.
/// </summary>
public sealed class DependencyRuleTests
{
    private static readonly System.Reflection.Assembly CoreAssembly = typeof(CoherenceEngine).Assembly;
    private static readonly System.Reflection.Assembly SolverAssembly = typeof(CpSatMaxSatSolver).Assembly;
    private static readonly System.Reflection.Assembly NliAssembly = typeof(OnnxEntailmentScorer).Assembly;
    private static readonly System.Reflection.Assembly ModelsAssembly = typeof(RecordingLanguageModel).Assembly;
    private static readonly System.Reflection.Assembly ReportsAssembly = typeof(IReportWriter).Assembly;
    private static readonly System.Reflection.Assembly LocalModelAssembly = typeof(LocalLanguageModel).Assembly;
    private static readonly System.Reflection.Assembly CliAssembly = typeof(PlumbCli).Assembly;
    private static readonly System.Reflection.Assembly ApplicationAssembly = typeof(Plumbline.Application.Running.ClaimRun).Assembly;

    private static readonly ArchUnitNET.Domain.Architecture Loaded = new ArchLoader()
        .LoadAssemblies(CoreAssembly, SolverAssembly, NliAssembly, ModelsAssembly, ReportsAssembly, LocalModelAssembly, ApplicationAssembly, CliAssembly)
        .Build();

    private static readonly (string Name, System.Reflection.Assembly Assembly)[] Adapters =
    [
        ("Solver", SolverAssembly),
        ("Nli", NliAssembly),
        ("Models", ModelsAssembly),
        ("Reports", ReportsAssembly),
        ("LocalModel", LocalModelAssembly),
    ];

    public static TheoryData<string> ForbiddenInCore => new()
    {
        "System.Net.Http",
        "Microsoft.ML.OnnxRuntime",
        "Microsoft.ML.OnnxRuntimeGenAI",
        "Google.OrTools",
        "Microsoft.Data.Sqlite",
        "Spectre.Console",
    };

    public static TheoryData<string> ForbiddenTypesInCore => new()
    {
        "System.Console",
        "System.IO.File",
        "System.IO.FileStream",
        "System.IO.FileInfo",
        "System.IO.Directory",
        "System.IO.StreamReader",
        "System.IO.StreamWriter",
        "System.Net.Http.HttpClient",
    };

    public static TheoryData<string, string> AdapterPairs()
    {
        var data = new TheoryData<string, string>();
        foreach (var (from, _) in Adapters)
        {
            foreach (var (to, _) in Adapters.Where(a => a.Name != from))
            {
                data.Add(from, to);
            }
        }

        return data;
    }

    /// <summary>Every type the loaded assemblies use, also those of assemblies that were not loaded themselves.</summary>
    private static GivenTypes Referenced() => Types(includeReferenced: true);

    private static System.Reflection.Assembly AdapterNamed(string name) => Adapters.Single(a => a.Name == name).Assembly;

    private static GivenTypesConjunction TypesIn(System.Reflection.Assembly assembly) => Types().That().ResideInAssembly(assembly);

    [Theory]
    [MemberData(nameof(ForbiddenInCore))]
    public void Core_DoesNotDependOnNamespace(string forbiddenNamespace)
    {
        IArchRule rule = Types().That().ResideInAssembly(CoreAssembly).Should()
            .NotDependOnAny(Referenced().That().ResideInNamespaceMatching($"^{forbiddenNamespace.Replace(".", "\\.", StringComparison.Ordinal)}(\\..*)?$"));

        rule.Check(Loaded);
    }

    [Theory]
    [MemberData(nameof(ForbiddenTypesInCore))]
    public void Core_DoesNotUseIoOrConsoleTypes(string forbiddenType)
    {
        IArchRule rule = Types().That().ResideInAssembly(CoreAssembly).Should()
            .NotDependOnAny(Referenced().That().HaveFullName(forbiddenType));

        rule.Check(Loaded);
    }

    [Theory]
    [MemberData(nameof(AdapterPairs))]
    public void Adapter_DoesNotDependOnAnotherAdapter(string from, string to)
    {
        IArchRule rule = TypesIn(AdapterNamed(from)).Should().NotDependOnAny(TypesIn(AdapterNamed(to)));

        rule.Check(Loaded);
        Assert.DoesNotContain(AdapterNamed(from).GetReferencedAssemblies(), r => r.Name == AdapterNamed(to).GetName().Name);
    }

    /// <summary>The application layer runs the engine through Core's ports; which model or NLI model sits behind them
    /// is the composition root's business, and parsing the command line is the CLI's.</summary>
    [Theory]
    [InlineData("Nli")]
    [InlineData("Models")]
    [InlineData("LocalModel")]
    public void Application_DoesNotDependOnModelSideAdapters(string adapter)
    {
        IArchRule rule = TypesIn(ApplicationAssembly).Should().NotDependOnAny(TypesIn(AdapterNamed(adapter)));

        rule.Check(Loaded);
        Assert.DoesNotContain(ApplicationAssembly.GetReferencedAssemblies(), r => r.Name == AdapterNamed(adapter).GetName().Name);
    }

    [Fact]
    public void Application_DoesNotParseTheCommandLine()
    {
        IArchRule rule = TypesIn(ApplicationAssembly).Should()
            .NotDependOnAny(Referenced().That().ResideInNamespaceMatching("^System\\.CommandLine(\\..*)?$"));

        rule.Check(Loaded);
        Assert.False(TypesIn(CliAssembly).Should()
            .NotDependOnAny(Referenced().That().ResideInNamespaceMatching("^System\\.CommandLine(\\..*)?$")).HasNoViolations(Loaded));
    }

    [Fact]
    public void Rules_SeeDependenciesThatExist()
    {
        // The same shapes of rule as above, aimed at dependencies that do exist, must report violations:
        // otherwise the rules above would pass for want of loaded dependencies.
        Assert.False(TypesIn(CliAssembly).Should().NotDependOnAny(TypesIn(CoreAssembly)).HasNoViolations(Loaded));
        Assert.False(TypesIn(CliAssembly).Should().NotDependOnAny(TypesIn(SolverAssembly)).HasNoViolations(Loaded));
        Assert.False(TypesIn(SolverAssembly).Should()
            .NotDependOnAny(Referenced().That().ResideInNamespaceMatching("^Google\\.OrTools(\\..*)?$")).HasNoViolations(Loaded));
        Assert.False(TypesIn(NliAssembly).Should()
            .NotDependOnAny(Referenced().That().HaveFullName("System.IO.File")).HasNoViolations(Loaded));
        Assert.False(TypesIn(LocalModelAssembly).Should()
            .NotDependOnAny(Referenced().That().ResideInNamespaceMatching("^Microsoft\\.ML\\.OnnxRuntimeGenAI(\\..*)?$")).HasNoViolations(Loaded));
        Assert.False(TypesIn(CliAssembly).Should()
            .NotDependOnAny(Referenced().That().HaveFullName("System.Console")).HasNoViolations(Loaded));
    }

    [Fact]
    public void Cli_ReferencesCoreAndEveryAdapter()
    {
        var referenced = CliAssembly.GetReferencedAssemblies().Select(r => r.Name).ToHashSet();

        Assert.Contains(CoreAssembly.GetName().Name, referenced);
        Assert.All(Adapters, a => Assert.Contains(a.Assembly.GetName().Name, referenced));
    }
}
