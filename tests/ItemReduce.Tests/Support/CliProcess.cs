using System.Diagnostics;
using System.Runtime.InteropServices;

namespace ItemReduce.Tests.Support;

/// <summary>Runs the built command-line program (itemreduce.dll beside the tests) as a separate process, for what an
/// in-process call cannot show: the working directory, the home folder, and signals.</summary>
public static class CliProcess
{
    private static string Dll => Path.Combine(AppContext.BaseDirectory, "itemreduce.dll");

    public static Process Start(string workingDirectory, IReadOnlyDictionary<string, string>? environment, params string[] args)
    {
        var psi = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = true,
            UseShellExecute = false,
        };
        psi.ArgumentList.Add("exec");
        psi.ArgumentList.Add(Dll);
        foreach (string a in args) psi.ArgumentList.Add(a);
        foreach (var (k, v) in environment ?? new Dictionary<string, string>()) psi.Environment[k] = v;
        return Process.Start(psi) ?? throw new InvalidOperationException("could not start dotnet");
    }

    /// <summary>Runs to the end; returns exit code, stdout and stderr.</summary>
    public static (int Code, string Out, string Err) Run(string workingDirectory, IReadOnlyDictionary<string, string>? environment, params string[] args)
    {
        using var p = Start(workingDirectory, environment, args);
        var stdout = p.StandardOutput.ReadToEndAsync();
        var stderr = p.StandardError.ReadToEndAsync();
        p.WaitForExit();
        return (p.ExitCode, stdout.Result, stderr.Result);
    }

    /// <summary>Sends SIGINT ("INT") or SIGTERM ("TERM") through libc's kill(2) (numbers 2 and 15 on Linux and macOS).</summary>
    public static void Signal(int pid, string signal)
    {
        int number = signal switch { "INT" => 2, "TERM" => 15, _ => throw new ArgumentException("INT or TERM", nameof(signal)) };
        if (Kill(pid, number) != 0) throw new InvalidOperationException($"kill({pid}, {number}) failed: errno {Marshal.GetLastPInvokeError()}");
    }

    [DllImport("libc", EntryPoint = "kill", SetLastError = true)]
    private static extern int Kill(int pid, int signal);
}
