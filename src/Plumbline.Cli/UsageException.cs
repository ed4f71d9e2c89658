namespace Plumbline.Cli;

/// <summary>The command line or the set-up it names cannot work; reported as one line with exit code 2.</summary>
internal sealed class UsageException(string message) : Exception(message);
