using Plumbline.Core.Inputs;
using Plumbline.Core.Language.Sources;
using Plumbline.Models.Cache;
using Plumbline.Nli;

namespace Plumbline.Cli;

/// <summary>
/// Runs a command's body and turns what it throws into one line on standard error and an exit code:
/// bad input and set-up are usage errors (2), an interruption or anything unforeseen leaves the run
/// incomplete (3).
/// </summary>
internal static class Guarded
{
    public static async Task<int> RunAsync(CliContext context, Func<Task<int>> body, CancellationToken cancellationToken)
    {
        try
        {
            return await body();
        }
        catch (Exception e) when (UsageMessage(e) is { } message)
        {
            await context.Error.WriteLineAsync(CliErrors.Line(message));
            return ExitCodes.UsageError;
        }
        catch (OperationCanceledException) when (cancellationToken.IsCancellationRequested)
        {
            await context.Error.WriteLineAsync(CliErrors.Line("interrupted"));
            return ExitCodes.Incomplete;
        }
        catch (Exception e)
        {
            await context.Error.WriteLineAsync(CliErrors.Line($"unexpected {e.GetType().Name}: {e.Message}"));
            return ExitCodes.Incomplete;
        }
    }

    /// <summary>The message for an error the user can fix, or null for anything else.</summary>
    internal static string? UsageMessage(Exception e) => e switch
    {
        UsageException or InputFormatException or NliModelException or ModelSourceException or ResponseCacheException => e.Message,
        FileNotFoundException notFound => $"{notFound.FileName ?? "file"}: file not found",
        DirectoryNotFoundException or UnauthorizedAccessException or IOException => e.Message,
        _ => null,
    };
}
