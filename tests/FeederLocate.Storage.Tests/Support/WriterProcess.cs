using System.Diagnostics;
using System.Reflection;
using System.Text;
using FeederLocate.Storage.Incidents;

namespace FeederLocate.Storage.Tests.Support;

/// <summary>
/// A running FeederLocate.Storage.Tests.Writer: appends indication events to one incident and prints each
/// committed event id. Disposing kills it if it still runs.
/// </summary>
public sealed class WriterProcess : IDisposable
{
    private readonly Process _process;
    private readonly StringBuilder _errors = new();

    private WriterProcess(Process process)
    {
        _process = process;
        _process.ErrorDataReceived += (_, e) =>
        {
            if (e.Data is not null)
            {
                lock (_errors)
                {
                    _errors.AppendLine(e.Data);
                }
            }
        };
        _process.BeginErrorReadLine();
    }

    /// <summary>Everything the writer wrote to standard error so far.</summary>
    public string Errors
    {
        get
        {
            lock (_errors)
            {
                return _errors.ToString();
            }
        }
    }

    public int ExitCode => _process.ExitCode;

    /// <summary>Starts the writer and waits until it has opened the store and printed "ready".</summary>
    public static async Task<WriterProcess> StartAsync(string databasePath, IncidentId incident, int count, string actor, CancellationToken cancel)
    {
        var start = new ProcessStartInfo(DotnetHost())
        {
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(WriterDll());
        start.ArgumentList.Add(databasePath);
        start.ArgumentList.Add(incident.ToString());
        start.ArgumentList.Add(count.ToString(System.Globalization.CultureInfo.InvariantCulture));
        start.ArgumentList.Add(actor);
        var writer = new WriterProcess(Process.Start(start) ?? throw new InvalidOperationException("the writer process did not start"));
        try
        {
            var first = await writer.ReadLineAsync(cancel);
            if (first != "ready")
            {
                await writer._process.WaitForExitAsync(cancel);
                throw new InvalidOperationException($"writer did not get ready: printed \"{first}\", stderr: {writer.Errors}");
            }

            return writer;
        }
        catch
        {
            writer.Dispose();
            throw;
        }
    }

    /// <summary>Lets the writer begin appending.</summary>
    public void Go()
    {
        _process.StandardInput.WriteLine("go");
        _process.StandardInput.Flush();
    }

    /// <summary>The next line the writer printed, or null once it has ended.</summary>
    public Task<string?> ReadLineAsync(CancellationToken cancel) => _process.StandardOutput.ReadLineAsync(cancel).AsTask();

    /// <summary>Every line until the writer ends, then waits for it to exit.</summary>
    public async Task<List<string>> ReadToEndAsync(CancellationToken cancel)
    {
        var lines = new List<string>();
        while (await ReadLineAsync(cancel) is { } line)
        {
            lines.Add(line);
        }

        await _process.WaitForExitAsync(cancel);
        return lines;
    }

    /// <summary>Kills the writer where it stands, without any chance to finish its transaction.</summary>
    public void Kill()
    {
        if (!_process.HasExited)
        {
            _process.Kill(entireProcessTree: true);
        }

        _process.WaitForExit();
    }

    public void Dispose()
    {
        try
        {
            Kill();
        }
        finally
        {
            _process.Dispose();
        }
    }

    private static string WriterDll()
    {
        var path = typeof(WriterProcess).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>()
            .Single(a => a.Key == "StorageTestsWriterPath").Value;
        return File.Exists(path)
            ? path
            : throw new FileNotFoundException($"the writer was not built at {path}; build the test project, which builds it");
    }

    private static string DotnetHost()
    {
        // The SDK names the host it runs on; a test host started by it runs on the same one.
        if (Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } host && File.Exists(host))
        {
            return host;
        }

        var self = Environment.ProcessPath;
        return self is not null && Path.GetFileNameWithoutExtension(self) == "dotnet" ? self : "dotnet";
    }
}
