using System.Runtime.InteropServices;
using ItemReduce.IO;

namespace ItemReduce.Cli;

internal static class Program
{
    private static int Main(string[] args)
    {
        // SIGINT (Ctrl+C) and SIGTERM: remove unfinished results, say so in one line, exit 130 / 143.
        using var interrupt = PosixSignalRegistration.Create(PosixSignal.SIGINT, ctx => Stop(ctx, "SIGINT", 130));
        using var terminate = PosixSignalRegistration.Create(PosixSignal.SIGTERM, ctx => Stop(ctx, "SIGTERM", 143));
        return CliApp.Run(args, Console.Out, Console.Error, !Console.IsErrorRedirected, !Console.IsOutputRedirected);
    }

    private static void Stop(PosixSignalContext context, string signal, int code)
    {
        context.Cancel = true;
        OutputStaging.AbandonAll(removed =>
        {
            Console.Error.WriteLine(removed
                ? $"itemreduce: stopped by {signal}; the unfinished results were removed and nothing was written."
                : $"itemreduce: stopped by {signal}.");
            Console.Error.Flush();
            Environment.Exit(code);
        });
    }
}
