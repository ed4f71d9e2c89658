using Plumbline.Reports.Model;

namespace Plumbline.Application.Running;

/// <summary>Where the run tells a person what went wrong while it goes on (standard error, in the command line).</summary>
public interface IRunDiagnostics
{
    /// <summary>Something failed without stopping the run; <paramref name="exception"/> is there for a debug trace.</summary>
    void Problem(RunProblem problem, Exception? exception);
}
