namespace Plumbline.Application;

/// <summary>The command line or the set-up it names cannot work; reported as one line with exit code 2, before anything is spent.</summary>
public sealed class UsageException(string message) : Exception(message);
