using System.Diagnostics;
using System.Net;
using System.Text;
using System.Text.Json;

namespace FeederLocate.LoadTest;

/// <summary>
/// One client of the load: until the time is up it posts a batch of one to three indications to its
/// incident, then reads the incident's ranking, and again. It keeps what it measured and every
/// indication the API accepted. A request that has started is always finished, so that what it did to
/// the log is known.
/// </summary>
public sealed class LoadClient
{
    private readonly HttpClient _http;
    private readonly LoadIncident _incident;
    private readonly ReadingClock _readings;
    private readonly LoadCounters _counters;
    private readonly Random _random;
    private readonly List<AcceptedIndication> _accepted = [];

    public LoadClient(HttpClient http, LoadIncident incident, ReadingClock readings, LoadCounters counters, int seed)
    {
        ArgumentNullException.ThrowIfNull(http);
        ArgumentNullException.ThrowIfNull(incident);
        ArgumentNullException.ThrowIfNull(readings);
        ArgumentNullException.ThrowIfNull(counters);
        _http = http;
        _incident = incident;
        _readings = readings;
        _counters = counters;
        _random = new Random(seed);
    }

    public LatencyRecorder Posts { get; } = new();

    public LatencyRecorder Rankings { get; } = new();

    public ErrorTally Errors { get; } = new();

    public IReadOnlyList<AcceptedIndication> Accepted => _accepted;

    /// <summary>Runs until <paramref name="clock"/> passes <paramref name="until"/> or <paramref name="stop"/> is cancelled.</summary>
    public async Task RunAsync(Stopwatch clock, TimeSpan until, CancellationToken stop)
    {
        ArgumentNullException.ThrowIfNull(clock);
        while (clock.Elapsed < until && !stop.IsCancellationRequested)
        {
            await PostBatch(clock);
            if (clock.Elapsed >= until || stop.IsCancellationRequested)
            {
                break;
            }

            await ReadRanking(clock);
        }
    }

    private async Task PostBatch(Stopwatch clock)
    {
        const string what = "POST indications";
        var batch = IndicationBatch.Random(_random, _incident.Grid, _readings);
        var started = clock.Elapsed;
        try
        {
            using var content = new StringContent(batch.ToJson(), Encoding.UTF8, "application/json");
            using var response = await _http.PostAsync($"/api/incidents/{_incident.Id}/indications", content);
            var text = await response.Content.ReadAsStringAsync();
            Posts.Add(started, clock.Elapsed - started);
            if (response.StatusCode != HttpStatusCode.Accepted)
            {
                Fail($"{what}: {(int)response.StatusCode} {response.StatusCode}");
                return;
            }

            // A 202 keeps the whole batch or none of it, so every indication of it must be in the log.
            _accepted.AddRange(batch.Indications.Select(i => new AcceptedIndication(_incident.Id, i)));
            _counters.Accepted(batch.Indications.Count);
            if (AcceptedCount(text) is not { } accepted || accepted != batch.Indications.Count)
            {
                Fail($"{what}: 202 with an accepted count other than the batch's {batch.Indications.Count}");
            }
        }
#pragma warning disable CA1031 // every failure of a request is counted by kind, none ends the run
        catch (Exception e)
#pragma warning restore CA1031
        {
            Posts.Add(started, clock.Elapsed - started);
            Fail($"{what}: {KindOf(e)}");
        }
        finally
        {
            _counters.Request();
        }
    }

    private async Task ReadRanking(Stopwatch clock)
    {
        const string what = "GET ranking";
        var started = clock.Elapsed;
        try
        {
            using var response = await _http.GetAsync($"/api/incidents/{_incident.Id}/ranking");
            var text = await response.Content.ReadAsStringAsync();
            Rankings.Add(started, clock.Elapsed - started);
            if (response.StatusCode != HttpStatusCode.OK)
            {
                Fail($"{what}: {(int)response.StatusCode} {response.StatusCode}");
            }
            else if (!IsRanking(text))
            {
                Fail($"{what}: 200 without sections");
            }
        }
#pragma warning disable CA1031 // as above
        catch (Exception e)
#pragma warning restore CA1031
        {
            Rankings.Add(started, clock.Elapsed - started);
            Fail($"{what}: {KindOf(e)}");
        }
        finally
        {
            _counters.Request();
        }
    }

    private void Fail(string kind)
    {
        Errors.Add(kind);
        _counters.Error();
    }

    private static string KindOf(Exception e) => e is TaskCanceledException { InnerException: TimeoutException }
        ? "timeout"
        : e.InnerException is { } inner ? $"{e.GetType().Name} ({inner.GetType().Name})" : e.GetType().Name;

    private static int? AcceptedCount(string text)
    {
        try
        {
            using var document = JsonDocument.Parse(text);
            return document.RootElement.TryGetProperty("accepted", out var accepted) && accepted.TryGetInt32(out var n) ? n : null;
        }
        catch (JsonException)
        {
            return null;
        }
    }

    private static bool IsRanking(string text)
    {
        try
        {
            using var document = JsonDocument.Parse(text);
            return document.RootElement.TryGetProperty("sections", out var sections) && sections.ValueKind == JsonValueKind.Array && sections.GetArrayLength() > 0;
        }
        catch (JsonException)
        {
            return false;
        }
    }
}
