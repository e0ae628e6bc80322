using System.Text.Json;
using System.Text.Json.Serialization;

using static System.FormattableString;

namespace FeederLocate.LoadTest;

/// <summary>What a load run measured and found. Latencies in milliseconds, nearest-rank percentiles.</summary>
public sealed record LoadReport(
    int Clients,
    int Incidents,
    [property: JsonIgnore] TimeSpan Duration,
    long Requests,
    long Posts,
    long RankingReads,
    LatencySummary PostLatency,
    LatencySummary RankingLatency,
    IReadOnlyList<LoadWindow> Windows,
    IReadOnlyDictionary<string, int> Errors,
    IReadOnlyList<IncidentLoad> IncidentsAfter,
    double PeakWorkingSetMb,
    [property: JsonIgnore] TimeSpan ProcessorTime,
    VerificationResult Verification)
{
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web) { WriteIndented = true };

    public double DurationSeconds => Duration.TotalSeconds;

    public double RequestsPerSecond => Rate(Requests);

    public double PostsPerSecond => Rate(Posts);

    public double RankingReadsPerSecond => Rate(RankingReads);

    /// <summary>CPU time of this process (app and clients) over the run.</summary>
    public double ProcessorSeconds => ProcessorTime.TotalSeconds;

    /// <summary>Cores this process kept busy on average; well under the machine's count means it waited (for the disk, or for other work on the machine).</summary>
    public double CoresBusy => Duration > TimeSpan.Zero ? ProcessorTime / Duration : 0;

    public int ProcessorCount => Environment.ProcessorCount;

    public int ErrorCount => Errors.Values.Sum();

    public int AcceptedIndications => Verification.Accepted;

    /// <summary>No request failed and the log holds exactly what was accepted.</summary>
    public bool Passed => ErrorCount == 0 && Verification.Passed;

    public string ToJson() => JsonSerializer.Serialize(this, Json);

    public void WriteText(TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(output);
        output.WriteLine(Invariant($"load test: {Clients} clients on {Incidents} incidents, {Duration.TotalSeconds:F1} s on loopback"));
        output.WriteLine(Invariant($"requests      {Requests} ({RequestsPerSecond:F1}/s): {Posts} posts ({PostsPerSecond:F1}/s), {RankingReads} ranking reads ({RankingReadsPerSecond:F1}/s)"));
        output.WriteLine("latency ms         n      p50      p95      p99      max");
        Row(output, "posts", PostLatency);
        Row(output, "ranking reads", RankingLatency);
        output.WriteLine("p95 ms by time     requests   posts  ranking");
        foreach (var w in Windows)
        {
            output.WriteLine(Invariant($"{$"{w.FromSeconds:F0}-{w.ToSeconds:F0} s",-16} {w.Requests,10} {w.PostP95Ms,7:F1} {w.RankingP95Ms,8:F1}"));
        }

        output.WriteLine(Invariant($"process       {ProcessorTime.TotalSeconds:F1} s CPU ({CoresBusy:F2} of {ProcessorCount} cores busy), peak working set {PeakWorkingSetMb:F0} MB (app and clients in one process)"));
        output.WriteLine(Invariant($"incidents     {string.Join(", ", IncidentsAfter.Select(i => $"#{i.Id} {i.Grid}: {i.Events} events"))}"));
        output.WriteLine(Invariant($"errors        {ErrorCount}{(ErrorCount == 0 ? string.Empty : ": " + string.Join("; ", Errors.Select(e => $"{e.Key} × {e.Value}")))}"));
        var v = Verification;
        output.WriteLine(Invariant($"accepted      {v.Accepted} indications"));
        output.WriteLine(Invariant($"log           {v.Logged} indications logged (by {string.Join(", ", v.LoggedBy)}); missing {v.Missing}, not accepted or twice {v.Unexpected}, not by {v.ExpectedAccount} {v.Misattributed}"));
        foreach (var finding in v.Findings)
        {
            output.WriteLine($"              {finding}");
        }

        output.WriteLine(Passed
            ? "verdict       PASS: no errors, every accepted indication is in the log once, by its account, and nothing else"
            : $"verdict       FAIL: {(ErrorCount > 0 ? $"{ErrorCount} errors" : "no errors")}, log check {(v.Passed ? "passed" : "failed")}");
    }

    private double Rate(long count) => Duration > TimeSpan.Zero ? count / Duration.TotalSeconds : 0;

    private static void Row(TextWriter output, string label, LatencySummary s) =>
        output.WriteLine(Invariant($"{label,-14} {s.Count,7} {s.P50Ms,8:F1} {s.P95Ms,8:F1} {s.P99Ms,8:F1} {s.MaxMs,8:F1}"));
}

/// <summary>A stretch of the run, by when the requests started: how many, and their p95 latency in milliseconds.</summary>
public sealed record LoadWindow(double FromSeconds, double ToSeconds, int Requests, double PostP95Ms, double RankingP95Ms);

/// <summary>An incident after the run: how many events its log holds (each request folds them all).</summary>
public sealed record IncidentLoad(long Id, string Grid, int Events);
