using Plumbline.Application.Running;
using Plumbline.Reports.Model;

namespace Plumbline.Application.Tests.Doubles;

internal sealed class CollectedDiagnostics : IRunDiagnostics
{
    public List<RunProblem> Problems { get; } = [];

    public void Problem(RunProblem problem, Exception? exception) => Problems.Add(problem);
}
