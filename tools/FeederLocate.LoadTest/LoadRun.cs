using System.Diagnostics;
using System.Net.Http.Headers;
using FeederLocate.Storage;
using FeederLocate.Storage.Incidents;

using static System.FormattableString;

namespace FeederLocate.LoadTest;

/// <summary>
/// One bounded load run: the app on a loopback port with a fresh log, incidents opened across the
/// grids, the clients posting and reading concurrently for the given time, then the app stopped and
/// its log checked against what was accepted.
/// </summary>
public static class LoadRun
{
    private static readonly DateTimeOffset ReportedAt = new(2026, 11, 30, 6, 12, 0, TimeSpan.Zero);
    private static readonly TimeSpan RequestTimeout = TimeSpan.FromSeconds(30);
    private static readonly TimeSpan ProgressEvery = TimeSpan.FromSeconds(1);

    /// <param name="progress">Gets a line at least once a second while the clients run; null for none.</param>
    public static async Task<LoadReport> RunAsync(LoadOptions options, TextWriter? progress, CancellationToken cancellation = default)
    {
        ArgumentNullException.ThrowIfNull(options);
        if (options.Problems() is { Count: > 0 } problems)
        {
            throw new ArgumentException(string.Join(Environment.NewLine, problems), nameof(options));
        }

        var grids = GridFolder.Read(options.GridFolder);
        if (grids.Count == 0)
        {
            throw new ArgumentException($"--grid-folder \"{options.GridFolder}\" holds no valid *.grid.json with indicators", nameof(options));
        }

        await using var app = await LoopbackApp.StartAsync(options.GridFolder, cancellation);
        var incidents = new List<LoadIncident>();
        using (var setup = ClientOf(app))
        {
            for (var i = 0; i < options.Incidents; i++)
            {
                // Incidents on the same grid trip different breakers.
                incidents.Add(await LoadIncident.OpenAsync(setup, grids[i % grids.Count], i / grids.Count, ReportedAt.AddMinutes(i), cancellation));
            }
        }

        var readings = new ReadingClock(ReportedAt.AddMinutes(1));
        var counters = new LoadCounters();
        var https = Enumerable.Range(0, options.Clients).Select(_ => ClientOf(app)).ToList();
        var clients = https.Select((http, k) => new LoadClient(http, incidents[k % incidents.Count], readings, counters, unchecked((options.Seed * 7919) + k))).ToList();
        TimeSpan duration;
        double peakWorkingSetMb;
        TimeSpan processorTime;
        try
        {
            var cpuBefore = ProcessorTimeNow();
            var clock = Stopwatch.StartNew();
            using var progressStop = new CancellationTokenSource();
            var shown = ShowProgress(progress, clock, counters, progressStop.Token);
            await Task.WhenAll(clients.Select(c => Task.Run(() => c.RunAsync(clock, options.Duration, cancellation), CancellationToken.None)));
            duration = clock.Elapsed;
            processorTime = ProcessorTimeNow() - cpuBefore;
            using (var process = Process.GetCurrentProcess())
            {
                peakWorkingSetMb = process.PeakWorkingSet64 / 1e6;
            }

            await progressStop.CancelAsync();
            await shown;
        }
        finally
        {
            https.ForEach(h => h.Dispose());
        }

        await app.StopAsync();
        var accepted = clients.SelectMany(c => c.Accepted).ToList();
        var verification = LogVerification.Verify(app.DatabasePath, [.. incidents.Select(i => i.Id)], accepted, LoopbackApp.AccountName);
        var posts = LatencyRecorder.Merge(clients.Select(c => c.Posts));
        var rankings = LatencyRecorder.Merge(clients.Select(c => c.Rankings));
        return new LoadReport(
            options.Clients,
            incidents.Count,
            duration,
            posts.Count + rankings.Count,
            posts.Count,
            rankings.Count,
            posts.Summary(),
            rankings.Summary(),
            Windows(options.Duration, posts, rankings),
            ErrorTally.Merge(clients.Select(c => c.Errors)).ByKind,
            EventsOf(app.DatabasePath, incidents),
            peakWorkingSetMb,
            processorTime,
            verification);
    }

    private static TimeSpan ProcessorTimeNow()
    {
        using var process = Process.GetCurrentProcess();
        return process.TotalProcessorTime;
    }

    private static HttpClient ClientOf(LoopbackApp app)
    {
        // Each client has its own connection, as separate systems would.
        var http = new HttpClient(new SocketsHttpHandler()) { BaseAddress = app.Address, Timeout = RequestTimeout };
        http.DefaultRequestHeaders.Authorization = new AuthenticationHeaderValue("Bearer", app.TokenSecret);
        return http;
    }

    /// <summary>Six windows (of 10 s in a minute), whole seconds, at least 1 s each.</summary>
    private static List<LoadWindow> Windows(TimeSpan duration, LatencyRecorder posts, LatencyRecorder rankings)
    {
        var length = TimeSpan.FromSeconds(Math.Max(1, Math.Round(duration.TotalSeconds / 6)));
        var windows = new List<LoadWindow>();
        for (var from = TimeSpan.Zero; from < duration; from += length)
        {
            var to = from + length < duration ? from + length : duration;
            var p = posts.Summary(from, to);
            var r = rankings.Summary(from, to);
            windows.Add(new LoadWindow(from.TotalSeconds, to.TotalSeconds, p.Count + r.Count, p.P95Ms, r.P95Ms));
        }

        return windows;
    }

    private static List<IncidentLoad> EventsOf(string databasePath, IEnumerable<LoadIncident> incidents)
    {
        using var store = IncidentStore.Open(databasePath);
        return [.. incidents.Select(i => new IncidentLoad(i.Id, i.Grid.Name, store.Events(new IncidentId(i.Id)).Count))];
    }

    private static async Task ShowProgress(TextWriter? progress, Stopwatch clock, LoadCounters counters, CancellationToken stop)
    {
        if (progress is null)
        {
            return;
        }

        using var timer = new PeriodicTimer(ProgressEvery);
        try
        {
            while (await timer.WaitForNextTickAsync(stop))
            {
                progress.WriteLine(Invariant(
                    $"{clock.Elapsed.TotalSeconds,5:F0} s  {counters.Requests} requests  {counters.Errors} errors  {counters.AcceptedIndications} indications accepted"));
            }
        }
        catch (OperationCanceledException)
        {
            // the clients are done
        }
    }
}
