using System.Runtime.InteropServices;
using Plumbline.Cli;
using Plumbline.Cli.Hosting;

NativeHeap.LimitArenas();

// SIGINT (Ctrl+C) and SIGTERM ask the run to stop and write what it finished; a second signal ends the process at once.
using var interrupt = new CancellationTokenSource();
void Stop(PosixSignalContext signal)
{
    if (!interrupt.IsCancellationRequested)
    {
        signal.Cancel = true;
        interrupt.Cancel();
    }
}

using var sigint = PosixSignalRegistration.Create(PosixSignal.SIGINT, Stop);
using var sigterm = PosixSignalRegistration.Create(PosixSignal.SIGTERM, Stop);
return await PlumbCli.RunAsync(args, CliContext.ForConsole(), interrupt.Token);
