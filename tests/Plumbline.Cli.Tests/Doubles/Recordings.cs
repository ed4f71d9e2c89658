using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Models.Recording;
using Plumbline.Solver;

namespace Plumbline.Cli.Tests.Doubles;

/// <summary>Makes real recording files by running the engine on the scripted model through a recording tap.</summary>
internal static class Recordings
{
    /// <summary>Records every request the engine makes (default settings) to judge each claim; returns the file's path.</summary>
    public static Task<string> WriteAsync(string path, params (string Claim, double PTrue)[] claims) =>
        WriteAsync(path, CoherenceOptions.Default, claims);

    /// <summary>Records every request the engine makes with the given settings.</summary>
    public static async Task<string> WriteAsync(string path, CoherenceOptions options, params (string Claim, double PTrue)[] claims)
    {
        var model = new ScriptedLanguageModel(claims.ToDictionary(c => c.Claim, c => c.PTrue));
        await using (var writer = RecordingWriter.Create(path, options.PromptVersion))
        {
            var engine = new CoherenceEngine(new RecordingTap(model, writer), new NeutralScorer(), new CpSatMaxSatSolver(), options, TimeProvider.System);
            for (var i = 0; i < claims.Length; i++)
            {
                var verdict = await engine.JudgeAsync(new Claim($"r{i}", claims[i].Claim), CancellationToken.None);
                if (verdict.IsFailed)
                {
                    throw new InvalidOperationException($"recording the claim failed: {verdict.Error}");
                }
            }
        }

        return path;
    }
}
